import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { errorHandler, isDatabaseUnavailable } from './error-handler.ts';

function appThrowing(error: unknown) {
  const app = express();
  app.get('/items/:id', () => {
    throw error;
  });
  app.use(errorHandler);
  return app;
}

describe('the error handler', () => {
  it('when a path parameter is not valid percent-encoded UTF-8, then it is a 400 problem, not a 500', async () => {
    const app = express();
    app.get('/items/:id', (_req, res) => void res.json({}));
    app.use(errorHandler);
    const res = await request(app).get('/items/%ED%A0%80');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.type).toBe('/problems/malformed-request');
  });

  it('when the database refuses or cuts the connection, then it is a 503 problem with Retry-After', async () => {
    const refused = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54329'), { code: 'ECONNREFUSED' });
    const shutdown = Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' });
    const wrapped = Object.assign(new Error('Failed query: select 1'), { cause: shutdown });
    for (const error of [refused, wrapped, new Error('Connection terminated unexpectedly')]) {
      const res = await request(appThrowing(error)).get('/items/1');
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('2');
      expect(res.body.type).toBe('/problems/service-unavailable');
    }
  });

  it('when any other error is thrown, then it is still a 500 problem', async () => {
    expect(isDatabaseUnavailable(Object.assign(new Error('duplicate key'), { code: '23505' }))).toBe(false);
    const res = await request(appThrowing(new Error('boom'))).get('/items/1');
    expect(res.status).toBe(500);
    expect(res.body.type).toBe('/problems/internal-error');
  });
});
