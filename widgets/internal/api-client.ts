/**
 * The widgets' client for the Ohmstead API: the embed key as a Bearer token, JSON in and out, answers typed
 * with the shared schemas' types, failures as a `WidgetApiError` a person can read. No cookies are sent
 * (`credentials: 'omit'`) and nothing but our API is called.
 *
 * A refused origin is not readable by the page: the API refuses the CORS preflight, so the browser reports
 * only a network error. The client then asks `POST /widgets/access` (a CORS-simple request: a text/plain
 * body, answered to any origin) whether this key may be used here, and turns the answer into a clear
 * refusal.
 */
import type { CalcOutput } from '#shared/calc/types.ts';
import type { Catalog } from '#shared/schemas/catalog.ts';
import type { ProblemDetails } from '#shared/schemas/problem.ts';

export type WidgetErrorKind = 'refused' | 'invalid' | 'limited' | 'unavailable' | 'failed';

export interface FieldProblem {
  pointer: string;
  detail: string;
}

export class WidgetApiError extends Error {
  override name = 'WidgetApiError';
  constructor(
    readonly kind: WidgetErrorKind,
    message: string,
    readonly status: number,
    readonly fieldProblems: FieldProblem[] = [],
    readonly problem?: ProblemDetails,
  ) {
    super(message);
  }
}

export interface ApiConfig {
  /** The API's origin, e.g. https://api.ohmstead.example (no trailing slash). */
  base: string;
  key: string;
  fetch?: typeof fetch;
}

interface AccessAnswer {
  allowed: boolean;
  detail: string;
}

/** Reads a failed answer as problem details (RFC 9457) when it is one. */
async function problemOf(response: Response): Promise<ProblemDetails | undefined> {
  try {
    const body = (await response.json()) as ProblemDetails;
    return typeof body?.detail === 'string' ? body : undefined;
  } catch {
    return undefined;
  }
}

export function errorFromProblem(status: number, problem: ProblemDetails | undefined, retryAfterS?: number): WidgetApiError {
  const detail = problem?.detail ?? `The calculation service answered ${status}.`;
  const fields = (problem?.errors ?? []).filter((e) => e.pointer).map((e) => ({ pointer: e.pointer!.replace(/^#/, ''), detail: e.detail }));
  if (status === 401 || status === 403) return new WidgetApiError('refused', `This calculator is not available here: ${detail}`, status, [], problem);
  if (status === 429) {
    const wait = retryAfterS ? ` Try again in ${retryAfterS} s.` : ' Try again shortly.';
    return new WidgetApiError('limited', `Too many calculations for now.${wait}`, status, [], problem);
  }
  if (status === 400 || status === 413 || status === 415 || status === 422) return new WidgetApiError('invalid', detail, status, fields, problem);
  return new WidgetApiError('failed', `The calculation service had a problem (${status}). Try again later.`, status, [], problem);
}

export function createApiClient(config: ApiConfig) {
  const doFetch = config.fetch ?? ((input: RequestInfo | URL, init?: RequestInit) => fetch(input, init));

  /** After a network-level failure: was it this page's origin being refused, or is the service unreachable? */
  async function explainFailure(): Promise<WidgetApiError> {
    try {
      const response = await doFetch(`${config.base}/widgets/access`, {
        method: 'POST',
        mode: 'cors',
        credentials: 'omit',
        headers: { 'Content-Type': 'text/plain' },
        body: config.key,
      });
      if (response.ok) {
        const answer = (await response.json()) as AccessAnswer;
        if (!answer.allowed) return new WidgetApiError('refused', `This calculator is not available on this site: ${answer.detail}`, 403);
      }
    } catch {
      // Unreachable as well: fall through.
    }
    return new WidgetApiError('unavailable', 'The calculation service could not be reached. Check the connection and try again.', 0);
  }

  async function call<T>(path: string, init: RequestInit): Promise<T> {
    if (!config.key) throw new WidgetApiError('refused', 'This calculator has no key: the page must set the key attribute to an Ohmstead embed key (ohs_emb_…).', 0);
    let response: Response;
    try {
      response = await doFetch(`${config.base}${path}`, {
        ...init,
        mode: 'cors',
        credentials: 'omit',
        headers: { Accept: 'application/json', Authorization: `Bearer ${config.key}`, ...(init.body ? { 'Content-Type': 'application/json' } : {}) },
      });
    } catch {
      throw await explainFailure();
    }
    if (!response.ok) {
      const retry = Number(response.headers.get('retry-after'));
      throw errorFromProblem(response.status, await problemOf(response), Number.isFinite(retry) && retry > 0 ? retry : undefined);
    }
    return (await response.json()) as T;
  }

  return {
    catalog: () => call<CalcOutput<Catalog>>('/v1/catalog', { method: 'GET' }).then((r) => r.data),
    calculate: <T>(path: string, body: unknown) => call<CalcOutput<T>>(path, { method: 'POST', body: JSON.stringify(body) }),
  };
}

export type ApiClient = ReturnType<typeof createApiClient>;

/** One catalog request per API and key on a page, however many widgets read it. */
const catalogs = new Map<string, Promise<Catalog>>();
export function sharedCatalog(client: ApiClient, config: ApiConfig): Promise<Catalog> {
  const id = `${config.base} ${config.key}`;
  let pending = catalogs.get(id);
  if (!pending) {
    pending = client.catalog();
    catalogs.set(id, pending);
    // A failure is not kept: the next widget (or a retry) asks again.
    pending.catch(() => catalogs.delete(id));
  }
  return pending;
}
