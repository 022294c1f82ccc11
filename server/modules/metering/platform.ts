/**
 * The metering platform of one server instance: key resolution, CORS, the group-commit batcher, the
 * request log and periodic pruning. Created by createApp; closed on shutdown (after in-flight requests).
 */
import type { Db } from '../../db/client.ts';
import type pg from 'pg';
import type { Env } from '../../env.ts';
import { EnvError } from '../../env.ts';
import type { Logger } from '../../logger.ts';
import { KeyResolver } from '../keys/key-resolver.ts';
import { MeterBatcher } from './meter-batcher.ts';
import { createMetering, type MeteringHooks } from './metering.ts';
import { pruneMeteringData, RequestLogWriter } from './request-log.ts';

/** Development and test only; production must set OHMSTEAD_KEY_HASH_SECRET. */
const DEVELOPMENT_KEY_HASH_SECRET = 'ohmstead-development-only-key-hash-secret-0001';

export function keyHashSecret(env: Env): string {
  if (env.OHMSTEAD_KEY_HASH_SECRET) return env.OHMSTEAD_KEY_HASH_SECRET;
  if (env.NODE_ENV === 'production') throw new EnvError('Invalid configuration:\n  OHMSTEAD_KEY_HASH_SECRET: required in production');
  return DEVELOPMENT_KEY_HASH_SECRET;
}

export function createPlatform(deps: { env: Env; db: Db; pool: pg.Pool; logger: Logger; hooks?: MeteringHooks }) {
  const { env, db, pool, logger } = deps;
  const hashSecret = keyHashSecret(env);
  const resolver = new KeyResolver(db, hashSecret, env.API_KEY_CACHE_TTL_MS);
  const batcher = new MeterBatcher(pool);
  const metering = createMetering(db, batcher, deps.hooks);
  const requestLog = new RequestLogWriter(db, logger);
  const pruneTimer = setInterval(() => {
    pruneMeteringData(db).catch((err: unknown) => logger.warn({ err }, 'pruning failed'));
  }, 60 * 60 * 1000);
  pruneTimer.unref();
  return {
    hashSecret,
    resolver,
    batcher,
    metering,
    requestLog,
    async close() {
      clearInterval(pruneTimer);
      await batcher.drain();
      await requestLog.flush();
    },
  };
}

export type Platform = ReturnType<typeof createPlatform>;
