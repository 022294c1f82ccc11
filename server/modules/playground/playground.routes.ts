/**
 * The console's playground: `POST /console-api/playground/<calculation>` runs a v1 calculation for the
 * signed-in member under one of the organization's server keys, chosen by id. The browser never holds a
 * server key (and /v1 refuses server keys from web pages on other sites); the call goes through the same
 * parts as a /v1 call instead: the key check (playground.service.ts), the request log, the shared schema,
 * the pure calculator, and `res.locals.sendMetered`, which counts the call against that key and its
 * organization's quota and rate before answering. It is counted and logged under the v1 endpoint it runs
 * (e.g. /v1/packs/energy), so Usage and the request log show it like any call.
 */
import { Router, type Request, type RequestHandler, type Response } from 'express';
import { parseCapacityLogCsv } from '#shared/calc/capacity-test/capacity-test.ts';
import { CapacityTestInputSchema } from '#shared/schemas/capacity-test.ts';
import { z } from 'zod';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody, parseWith } from '../../http/validate.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import { runCalc, sendCalcResult } from '../calc/calc-handler.ts';
import type { Platform } from '../metering/platform.ts';
import { PLAYGROUND_ROLES, playgroundCalculations, PlaygroundKeyIdSchema, type PlaygroundCalculation } from './playground.calcs.ts';
import { resolvePlaygroundKey } from './playground.service.ts';

const KeyIdOnlySchema = z.object({ keyId: PlaygroundKeyIdSchema });

/**
 * The request as the v1 API sees it, for the metering and request-log middlewares, which name a call by
 * `baseUrl + path`: a view over `req` with the v1 endpoint's path. `req` itself is not changed.
 */
function asV1Request(req: Request, endpoint: string): Request {
  return Object.create(req, {
    baseUrl: { value: '/v1', enumerable: true },
    path: { value: endpoint.slice('/v1'.length), enumerable: true },
  }) as Request;
}

function use(middleware: RequestHandler, req: Request, res: Response): void {
  let called = false;
  void middleware(req, res, () => {
    called = true;
  });
  if (!called) throw new Error('playground: a metering middleware did not call next() synchronously');
}

/** The calculation input of a parsed capacity-test body: the JSON input, or the CSV log parsed as /v1 parses it. */
function capacityInput(body: { input?: unknown; csv?: { text: string; ratedAh: number; chemistry?: string; label?: string } }): unknown {
  if (!body.csv) return body.input;
  const { text, ...query } = body.csv;
  const parsed = parseCapacityLogCsv(text);
  if (!parsed.ok) {
    // The same problem POST /v1/capacity-tests/evaluate gives for a text/csv body, pointing at the log.
    const listed = parsed.errors.filter((e) => e.row !== undefined).length;
    throw new AppError('validation-error', `The CSV log has ${listed === 1 ? 'a bad row' : 'bad rows'}: ${parsed.errors.map((e) => e.detail).join(' ')}`, {
      errors: parsed.errors.map((e) => ({ pointer: '#/csv/text', detail: e.detail, code: 'csv_row_invalid' })),
      extensions: { rows: parsed.errors.filter((e) => e.row !== undefined).map((e) => ({ row: e.row, ...(e.column ? { column: e.column } : {}), detail: e.detail })) },
    });
  }
  return parseWith(CapacityTestInputSchema, { ...query, samples: parsed.samples }, 'body');
}

function playgroundHandler(db: Db, platform: Platform, calc: PlaygroundCalculation): RequestHandler {
  const logRequest = platform.requestLog.middleware();
  return async (req, res) => {
    const v1Request = asV1Request(req, calc.endpoint);
    use(logRequest, v1Request, res);
    // The key first, as on /v1: a call with a usable key is logged even when its body fails validation.
    const { keyId } = parseJsonBody(KeyIdOnlySchema, req);
    res.locals.apiKey = await resolvePlaygroundKey(db, organizationAuth(res).organizationId, keyId);
    use(platform.metering.meterCalls, v1Request, res);
    const body = parseJsonBody(calc.body, req) as { input?: unknown; csv?: { text: string; ratedAh: number } };
    const input = calc.endpoint === '/v1/capacity-tests/evaluate' ? capacityInput(body) : body.input;
    await sendCalcResult(res, runCalc(calc.compute, input));
  };
}

export function playgroundConsoleRouter(deps: { db: Db; platform: Platform }) {
  const router = Router();
  for (const calc of playgroundCalculations) {
    router.post(calc.path, requireRole(...PLAYGROUND_ROLES), playgroundHandler(deps.db, deps.platform, calc));
  }
  return router;
}
