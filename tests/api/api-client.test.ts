/**
 * The typed API client (shared/api-client): its committed types match openapi/openapi.json, and it
 * works end to end against the real server over HTTP with a real key.
 */
import { readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientTypesPath, renderClientTypes } from '../../scripts/client-gen/generate.mjs';
import { createOhmsteadClient } from '../../shared/api-client/client.ts';
import { v1Client } from '../setup/v1.ts';

describe('the committed client types', () => {
  it('when regenerated from openapi/openapi.json, then they equal shared/api-client/schema.d.ts (run `npm run client`)', async () => {
    expect(readFileSync(clientTypesPath, 'utf8')).toBe(await renderClientTypes());
  });
});

describe('the typed client against the running server', () => {
  const api = v1Client();
  let server: ReturnType<typeof api.app.listen>;
  let baseUrl = '';
  beforeAll(async () => {
    server = api.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(() => new Promise((resolve) => server.close(resolve)));

  it('when it sizes a wire with a server key, then it gets the typed result', async () => {
    const ohmstead = createOhmsteadClient({ baseUrl, apiKey: api.key });
    const { data, error, response } = await ohmstead.POST('/v1/wires/size', { body: { currentA: 20, systemVoltageV: 48, oneWayLengthFt: 10 } });
    expect(error).toBeUndefined();
    expect(response.status).toBe(200);
    // NEC 2023 Table 310.16, 75 °C column: 20 A continuous needs 25 A; 12 AWG (25 A) is limited to a 20 A
    // fuse by 240.4(D) while the current needs a 25 A fuse, so 10 AWG is the smallest that passes.
    expect(data?.data.recommended?.size).toBe('10 AWG');
    expect(data?.cautions.length).toBeGreaterThan(0);
  });

  it('when the body fails validation, then the error is the 422 problem with a pointer to the field', async () => {
    const ohmstead = createOhmsteadClient({ baseUrl, apiKey: api.key });
    const { data, error, response } = await ohmstead.POST('/v1/wires/size', { body: { currentA: -1, systemVoltageV: 48, oneWayLengthFt: 10 } });
    expect(data).toBeUndefined();
    expect(response.status).toBe(422);
    expect(error?.errors?.map((e) => e.pointer)).toContain('#/currentA');
  });

  it('when no key is given, then the answer is 401', async () => {
    const { response } = await createOhmsteadClient({ baseUrl }).GET('/v1/reference/chemistries');
    expect(response.status).toBe(401);
  });
});
