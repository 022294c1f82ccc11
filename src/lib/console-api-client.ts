/**
 * The console's instance of the typed API client (shared/api-client, generated from the OpenAPI document):
 * same origin, the session cookie and the CSRF header. `unwrap` turns an error answer into the same
 * `ApiProblem` the console's fetch wrapper throws.
 */
import { createOhmsteadClient } from '#shared/api-client/client.ts';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { ProblemDetailsSchema } from '#shared/schemas/problem.ts';
import { ApiProblem } from './api-client.ts';

export const consoleApi = createOhmsteadClient({
  baseUrl: '',
  credentials: 'same-origin',
  headers: { Accept: 'application/json', [CSRF_HEADER]: CSRF_HEADER_VALUE },
});

/** The data of a typed-client answer, or an `ApiProblem` thrown for its problem (or a network failure). */
export async function unwrap<T>(call: Promise<{ data?: T; error?: unknown; response: Response }>): Promise<T> {
  let result: { data?: T; error?: unknown; response: Response };
  try {
    result = await call;
  } catch (error) {
    if ((error as Error).name === 'AbortError') throw error;
    throw new ApiProblem({ type: 'about:blank', title: 'Network error', status: 0, detail: 'The server could not be reached. Check your connection and try again.' });
  }
  const { data, error, response } = result;
  if (response.ok && data !== undefined) return data;
  const parsed = ProblemDetailsSchema.safeParse(error);
  throw new ApiProblem(
    parsed.success ? parsed.data : { type: 'about:blank', title: response.statusText, status: response.status, detail: `The server answered ${response.status} ${response.statusText}.` },
  );
}
