import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../setup/app.ts';

const { app, pool } = createTestApp();
afterAll(() => pool.end());

describe('operations endpoints', () => {
  it('when /healthz is called, then it answers 200 without touching the database', async () => {
    const res = await request(app).get('/healthz');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('when /readyz is called with the database up, then it answers ready', async () => {
    const res = await request(app).get('/readyz');
    expect(res.status).toBe(200);
    expect(res.body.checks.database).toBe('ok');
  });

  it('when the OpenAPI document is requested, then it is served as OpenAPI 3.1', async () => {
    const res = await request(app).get('/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.paths['/healthz']).toBeDefined();
  });
});

describe('problem details for every error', () => {
  it('when a POST carries malformed JSON, then it is a 400 problem with the request id', async () => {
    const res = await request(app).post('/healthz').set('Content-Type', 'application/json').set('X-Request-Id', 'req-abcdefgh').send('{"a": ');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body).toMatchObject({ type: '/problems/malformed-request', status: 400, requestId: 'req-abcdefgh', instance: '/requests/req-abcdefgh' });
    expect(res.body.detail).toMatch(/not valid JSON/);
  });

  it('when malformed JSON goes to an unknown route, then it is still a 400 problem', async () => {
    const res = await request(app).post('/v1/nowhere').set('Content-Type', 'application/json').send('{nope');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  });

  it('when a route does not exist, then it is a 404 problem naming the method and path', async () => {
    const res = await request(app).get('/v1/does-not-exist');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body).toMatchObject({ type: '/problems/not-found', title: 'No such resource', status: 404 });
    expect(res.body.detail).toContain('GET /v1/does-not-exist');
  });

  it('when a body is larger than the limit, then it is a 413 problem', async () => {
    const big = JSON.stringify({ pad: 'x'.repeat(300_000) });
    const res = await request(app).post('/v1/anything').set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/payload-too-large');
  });

  it('when a problem type URI is followed, then it resolves to a page describing it', async () => {
    const res = await request(app).get('/problems/validation-error');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    expect(res.text).toContain('The request did not pass validation');
  });
});
