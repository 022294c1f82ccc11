/**
 * A supertest client for the public /v1 API against the real app and this run's database. It carries a
 * valid API key once keys exist, so calculation tests exercise the same path outside clients take.
 */
import request from 'supertest';
import { createTestApp } from './app.ts';

export function v1Client() {
  const { app, pool } = createTestApp();
  const auth = (r: request.Test) => r;
  return {
    app,
    post: (path: string, body?: unknown) => auth(request(app).post(path)).send(body as object),
    postRaw: (path: string, contentType: string, body: string) => auth(request(app).post(path)).set('Content-Type', contentType).send(body),
    get: (path: string) => auth(request(app).get(path)),
    close: () => pool.end(),
  };
}
