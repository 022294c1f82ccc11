import { Router } from 'express';
import { problemTypes, type ProblemSlug } from '../../http/problem.ts';
import { AppError } from '../../http/problem.ts';

const explanations: Record<ProblemSlug, string> = {
  'validation-error': 'The JSON body was read but a field is missing, of the wrong type or out of range. The errors list names each field by JSON Pointer.',
  'malformed-request': 'The body is not valid JSON, or a query parameter could not be read. Check quoting, commas and the Content-Type header.',
  'unsupported-media-type': 'The endpoint expects a JSON body (Content-Type: application/json); some accept text/csv where documented.',
  'payload-too-large': 'The body is larger than the server accepts. Send fewer rows or samples per request.',
  'not-found': 'No route or resource matches. Check the path and the HTTP method.',
  'method-not-allowed': 'The path exists but not with this HTTP method.',
  unauthorized: 'Send a valid API key in the Authorization header: "Authorization: Bearer <key>".',
  forbidden: 'The key or user is valid but may not do this (role, key kind or origin).',
  'idempotency-key-reused': 'An Idempotency-Key identifies one request. Retries must repeat the same method, path and body; a new request needs a new key.',
  conflict: 'The request conflicts with the current state, for example a repeated Idempotency-Key still in flight.',
  'rate-limited': 'Too many calls in the current minute. Wait for the number of seconds in Retry-After.',
  'quota-exceeded': "The organization's monthly call quota is used up. It resets at the start of the next UTC month, or raise the plan.",
  'calculation-error': 'The inputs are valid one by one but together describe something the model cannot solve, such as a load larger than the packs can deliver.',
  'service-unavailable': 'The server is starting or its database is unreachable. Try again shortly.',
  'internal-error': 'An unexpected error on our side. Quote the request id when you report it.',
};

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** Human pages for each problem `type` URI, as RFC 9457 recommends. */
export function problemsRouter() {
  const router = Router();
  router.get('/problems/:slug', (req, res) => {
    const slug = req.params.slug as ProblemSlug;
    if (!Object.hasOwn(problemTypes, slug)) throw new AppError('not-found', `There is no problem type "${req.params.slug}".`);
    const { title, status } = problemTypes[slug];
    res
      .type('html')
      .send(
        `<!doctype html><html lang="en"><meta charset="utf-8"><title>${escapeHtml(title)} — Ohmstead</title>` +
          `<body style="font-family: system-ui, sans-serif; max-width: 40rem; margin: 3rem auto; color: #2b2a28; background: #faf7f2">` +
          `<p>Ohmstead API problem type</p><h1>${escapeHtml(title)}</h1><p>HTTP status ${status}.</p><p>${escapeHtml(explanations[slug])}</p></body></html>`,
      );
  });
  return router;
}
