/**
 * Uploads a CSV file (multipart/form-data, field `file`) with the CSRF header the console sends on every
 * change; a refused file is thrown as the usual `ApiProblem`, whose `rowErrors` extension names each row,
 * line and column.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { CatalogCsvRowErrorSchema, CatalogImportResultSchema, type CatalogCsvRowError, type CatalogKind } from '#shared/schemas/catalog.ts';
import { ProblemDetailsSchema } from '#shared/schemas/problem.ts';
import { ApiProblem } from '../../../lib/api-client.ts';
import { catalogPaths } from './catalog-paths.ts';
import { catalogQueryOptions } from './get-catalog.ts';

export async function importCsv(input: { kind: CatalogKind; mode: 'merge' | 'replace'; file: File }) {
  const form = new FormData();
  form.append('file', input.file, input.file.name);
  let response: Response;
  try {
    response = await fetch(catalogPaths.importCsv(input.kind, input.mode), { method: 'POST', body: form, credentials: 'same-origin', headers: { [CSRF_HEADER]: CSRF_HEADER_VALUE, Accept: 'application/json' } });
  } catch {
    throw new ApiProblem({ type: 'about:blank', title: 'Network error', status: 0, detail: 'The server could not be reached. Check your connection and try again.' });
  }
  if (!response.ok) {
    const parsed = ProblemDetailsSchema.safeParse(await response.json().catch(() => null));
    throw new ApiProblem(parsed.success ? parsed.data : { type: 'about:blank', title: response.statusText, status: response.status, detail: `The server answered ${response.status}.` });
  }
  return CatalogImportResultSchema.parse(await response.json());
}

/** The row problems of a refused import, when the problem carries them. */
export function rowErrorsOf(error: unknown): CatalogCsvRowError[] {
  if (!(error instanceof ApiProblem)) return [];
  const parsed = CatalogCsvRowErrorSchema.array().safeParse(error.extension('rowErrors'));
  return parsed.success ? parsed.data : [];
}

export function useImportCsv() {
  const client = useQueryClient();
  return useMutation({ mutationFn: importCsv, onSuccess: () => client.invalidateQueries({ queryKey: catalogQueryOptions().queryKey }) });
}
