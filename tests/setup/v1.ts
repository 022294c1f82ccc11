/**
 * A supertest client for the public /v1 API against the real app and this run's database, carrying a
 * real server key of its own organization (created in a beforeAll, with limits high enough that tests
 * are never throttled), so calculation tests take the same path outside clients take: key check,
 * metering, headers.
 */
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { createTestApp } from './app.ts';
import { createOrganization, createTestKey } from './fixtures.ts';

export function v1Client() {
  const { app, db, close } = createTestApp();
  const state: { key?: string; organizationId?: string } = {};
  beforeAll(async () => {
    const org = await createOrganization(db, { customMonthlyQuotaCalls: 10_000_000, customRatePerMinuteCalls: 1_000_000 });
    const { secret } = await createTestKey(db, app.platform!.hashSecret, org.id);
    state.key = secret;
    state.organizationId = org.id;
  });
  let closed: Promise<void> | undefined;
  const closeOnce = () => (closed ??= close());
  afterAll(closeOnce);
  const auth = (r: request.Test) => {
    if (!state.key) throw new Error('v1Client() must be created at the top level of a test file (its key is made in beforeAll)');
    return r.set('Authorization', `Bearer ${state.key}`);
  };
  return {
    app,
    db,
    get key() {
      return state.key!;
    },
    get organizationId() {
      return state.organizationId!;
    },
    post: (path: string, body?: unknown) => auth(request(app).post(path)).send(body as object),
    postRaw: (path: string, contentType: string, body: string) => auth(request(app).post(path)).set('Content-Type', contentType).send(body),
    get: (path: string) => auth(request(app).get(path)),
    close: closeOnce,
  };
}
