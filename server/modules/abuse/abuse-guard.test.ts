/**
 * The abuse guard's cost on the metered hot path (a known-good key, a successful calculation): two map
 * lookups, one address computation and a 'finish' listener per call. Express's own pipeline costs about
 * 350 µs per request on this machine (shared/stack.md); the guard must stay far below that.
 */
import { EventEmitter } from 'node:events';
import express, { type Request, type Response } from 'express';
import { describe, expect, it } from 'vitest';
import type { KeyResolver, ResolvedKey } from '../keys/key-resolver.ts';
import { createAbuseGuard } from './abuse-guard.ts';

const key: ResolvedKey = {
  id: '00000000-0000-4000-8000-000000000001',
  organizationId: '00000000-0000-4000-8000-000000000002',
  kind: 'server',
  name: 'bench',
  allowedOrigins: [],
  revokedAt: null,
  expiresAt: null,
  planId: 'scale',
  monthlyQuotaCalls: 1_000_000,
  ratePerMinuteCalls: 1_000_000,
};
const resolver = { resolveCached: () => key } as unknown as KeyResolver;
const limits = { addressFailuresPerMinute: 120, keyFailuresPerMinute: 120, keyReadsPerMinute: 300, consoleRequestsPerMinute: 600 };

const app = express();
function calculationCall() {
  const req = Object.create(app.request) as Request & { url: string; method: string; headers: Record<string, string> };
  Object.assign(req, { url: '/v1/packs/energy', method: 'POST', headers: { authorization: 'Bearer x' }, socket: { remoteAddress: '::ffff:127.0.0.1' }, app });
  const res = Object.assign(new EventEmitter(), { locals: { apiKey: key }, statusCode: 200, headersSent: false, setHeader() {}, getHeader() {} }) as unknown as Response;
  return { req, res };
}

describe('the abuse guard on the hot path', () => {
  it('when a known key makes a successful calculation, then the guard adds only microseconds and counts nothing', () => {
    const guard = createAbuseGuard({ limits, resolver });
    const next = () => {};
    const run = (n: number) => {
      const started = process.hrtime.bigint();
      for (let i = 0; i < n; i += 1) {
        const { req, res } = calculationCall();
        guard.addressGuard(req, res, next);
        guard.keyGuard(req, res, next);
        res.emit('finish');
      }
      return Number(process.hrtime.bigint() - started) / n / 1000;
    };
    const baseline = (n: number) => {
      const started = process.hrtime.bigint();
      for (let i = 0; i < n; i += 1) {
        const { res } = calculationCall();
        res.emit('finish');
      }
      return Number(process.hrtime.bigint() - started) / n / 1000;
    };
    run(5_000);
    baseline(5_000);
    // The fastest of five rounds of each: other work on a busy machine only ever adds time.
    const withGuard: number[] = [];
    const without: number[] = [];
    for (let r = 0; r < 5; r += 1) {
      withGuard.push(run(20_000));
      without.push(baseline(20_000));
    }
    const costUs = Math.min(...withGuard) - Math.min(...without);
    console.info(`[abuse] guard cost per metered call: ${costUs.toFixed(2)} µs`);
    // About 0.5 µs here; the bound is generous for a busy machine and still under 2 % of Express's ~350 µs.
    expect(costUs).toBeLessThan(6);
  });

  it('when calls succeed, then neither the key nor the address budget is used', () => {
    const guard = createAbuseGuard({ limits: { ...limits, addressFailuresPerMinute: 1, keyFailuresPerMinute: 1 }, resolver });
    for (let i = 0; i < 50; i += 1) {
      const { req, res } = calculationCall();
      let passed = false;
      guard.addressGuard(req, res, () => (passed = true));
      guard.keyGuard(req, res, () => {});
      res.emit('finish');
      expect(passed).toBe(true);
    }
  });
});
