import { describe, expect, it } from 'vitest';
import { EnvError, parseEnv } from './env.ts';

describe('parseEnv', () => {
  it('when DATABASE_URL is missing and PORT is not a number, then the error names both', () => {
    expect(() => parseEnv({ PORT: 'eighty' })).toThrow(EnvError);
    try {
      parseEnv({ PORT: 'eighty' });
    } catch (error) {
      expect((error as Error).message).toContain('DATABASE_URL');
      expect((error as Error).message).toContain('PORT');
    }
  });

  it('when the demo server key has the wrong prefix, then it is rejected', () => {
    expect(() => parseEnv({ DATABASE_URL: 'postgres://x@127.0.0.1/db', OHMSTEAD_DEMO_SERVER_KEY: 'sk_abc' })).toThrow(/OHMSTEAD_DEMO_SERVER_KEY/);
  });

  it('when only DATABASE_URL is given, then defaults fill the rest', () => {
    const env = parseEnv({ DATABASE_URL: 'postgres://x@127.0.0.1/db' });
    expect(env).toMatchObject({ PORT: 3000, HOST: '127.0.0.1', OHMSTEAD_PG_PORT: 54329, OHMSTEAD_DEMO_HIGH_LIMITS: false });
  });
});
