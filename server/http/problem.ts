/**
 * RFC 9457 problem details: the one error shape of the whole API. Each problem type has a stable
 * `type` URI (served as a human page under /problems/<slug>) and a fixed title.
 */
export const problemTypes = {
  'validation-error': { status: 422, title: 'The request did not pass validation' },
  'malformed-request': { status: 400, title: 'The request could not be read' },
  'unsupported-media-type': { status: 415, title: 'The request body has an unsupported media type' },
  'payload-too-large': { status: 413, title: 'The request body is too large' },
  'not-found': { status: 404, title: 'No such resource' },
  'method-not-allowed': { status: 405, title: 'Method not allowed on this resource' },
  unauthorized: { status: 401, title: 'Authentication is required' },
  forbidden: { status: 403, title: 'Not allowed' },
  conflict: { status: 409, title: 'The request conflicts with the current state' },
  'idempotency-key-reused': { status: 422, title: 'The Idempotency-Key was used with a different request' },
  'rate-limited': { status: 429, title: 'Too many requests' },
  'quota-exceeded': { status: 429, title: 'Monthly quota exhausted' },
  'calculation-error': { status: 422, title: 'The inputs describe a situation the model cannot solve' },
  'service-unavailable': { status: 503, title: 'The service is not ready' },
  'internal-error': { status: 500, title: 'Internal server error' },
} as const;

export type ProblemSlug = keyof typeof problemTypes;

/** Where a problem type is documented; a relative URI resolved against the API's origin. */
export const problemTypeUri = (slug: ProblemSlug) => `/problems/${slug}`;

export interface FieldError {
  /** JSON Pointer (RFC 6901) into the request body, as a URI fragment: "#/pack/seriesCells". */
  pointer?: string;
  /** For inputs outside the body. */
  parameter?: string;
  header?: string;
  detail: string;
  code?: string;
}

export interface ProblemBody {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  requestId?: string;
  errors?: FieldError[];
  [extension: string]: unknown;
}

/** An error that the error handler turns into a problem response with its own status and detail. */
export class AppError extends Error {
  override name = 'AppError';
  readonly slug: ProblemSlug;
  readonly status: number;
  readonly errors?: FieldError[];
  readonly extensions?: Record<string, unknown>;
  readonly headers?: Record<string, string>;

  constructor(
    slug: ProblemSlug,
    detail: string,
    options: { errors?: FieldError[]; extensions?: Record<string, unknown>; headers?: Record<string, string>; status?: number } = {},
  ) {
    super(detail);
    this.slug = slug;
    this.status = options.status ?? problemTypes[slug].status;
    this.errors = options.errors;
    this.extensions = options.extensions;
    this.headers = options.headers;
  }
}

/** JSON Pointer escaping per RFC 6901: "~" → "~0", "/" → "~1". */
export function toJsonPointer(path: ReadonlyArray<PropertyKey>): string {
  return `#/${path.map((p) => String(p).replaceAll('~', '~0').replaceAll('/', '~1')).join('/')}`.replace(/\/$/, '');
}

export function problemBody(slug: ProblemSlug, detail: string, extra: Partial<ProblemBody> = {}): ProblemBody {
  const { status, title } = problemTypes[slug];
  return { type: problemTypeUri(slug), title, status, detail, ...extra };
}
