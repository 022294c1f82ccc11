/**
 * The console's fetch wrapper: same-origin cookies, JSON bodies, the CSRF header on every request, answers
 * checked against the shared schemas, and RFC 9457 problems thrown as `ApiProblem`.
 */
import type { z } from 'zod';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { ProblemDetailsSchema, type ProblemDetails } from '#shared/schemas/problem.ts';

export class ApiProblem extends Error {
  override name = 'ApiProblem';
  readonly status: number;
  readonly problem: ProblemDetails;

  constructor(problem: ProblemDetails) {
    super(problem.detail);
    this.status = problem.status;
    this.problem = problem;
  }

  /** Field messages by top-level field name, from `errors[].pointer` ("#/email" → email). */
  get fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    for (const e of this.problem.errors ?? []) {
      const field = e.pointer?.replace(/^#\//, '').split('/')[0];
      if (field && !out[field]) out[field] = e.detail;
    }
    return out;
  }

  /** An extension member such as `reason`. */
  extension(name: string): unknown {
    return (this.problem as Record<string, unknown>)[name];
  }
}

export const isProblem = (error: unknown, status?: number): error is ApiProblem =>
  error instanceof ApiProblem && (status === undefined || error.status === status);

interface RequestOptions<S extends z.ZodType | undefined> {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  /** Parses the answer; leave out for 204 answers. */
  schema?: S;
  signal?: AbortSignal;
}

export async function apiRequest<S extends z.ZodType | undefined = undefined>(
  path: string,
  options: RequestOptions<S> = {},
): Promise<S extends z.ZodType ? z.output<S> : void> {
  const headers: Record<string, string> = { Accept: 'application/json', [CSRF_HEADER]: CSRF_HEADER_VALUE };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  let response: Response;
  try {
    response = await fetch(path, {
      method: options.method ?? 'GET',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (error) {
    if ((error as Error).name === 'AbortError') throw error;
    throw new ApiProblem({ type: 'about:blank', title: 'Network error', status: 0, detail: 'The server could not be reached. Check your connection and try again.' });
  }
  if (!response.ok) {
    const text = await response.text();
    let parsed: ProblemDetails | undefined;
    try {
      const result = ProblemDetailsSchema.safeParse(JSON.parse(text));
      if (result.success) parsed = result.data;
    } catch {
      parsed = undefined;
    }
    throw new ApiProblem(parsed ?? { type: 'about:blank', title: response.statusText, status: response.status, detail: `The server answered ${response.status} ${response.statusText}.` });
  }
  if (!options.schema || response.status === 204) return undefined as never;
  return options.schema.parse(await response.json()) as never;
}
