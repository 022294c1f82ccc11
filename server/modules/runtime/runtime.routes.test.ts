import { describe, expect, it } from 'vitest';
import { RuntimeResultSchema, runtimeInputExample } from '#shared/schemas/runtime.ts';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('POST /v1/runtime', () => {
  it('when a pack runs a 500 W AC load through a 90 % inverter, then battery power, current and runtime follow', async () => {
    // Energy balance (analytic): 4 096 Wh usable ÷ (500 W ÷ 0.9) = 7.3728 h; current = 555.6 W ÷ 51.2 V.
    const res = await api.post('/v1/runtime', { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, loads: [{ powerW: 500 }], inverterEfficiencyPct: 90 });
    expect(res.status).toBe(200);
    expect(RuntimeResultSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.data.batteryPowerW).toBeCloseTo(500 / 0.9, 9);
    expect(res.body.data.batteryCurrentA).toBeCloseTo(500 / 0.9 / 51.2, 9);
    expect(res.body.data.runtimeHours).toBeCloseTo(7.3728, 9);
    expect(res.body.cautions.join(' ')).toMatch(/local electrical codes/);
  });

  it('when the worked example is sent, then it answers 200 with the envelope', async () => {
    const res = await api.post('/v1/runtime', runtimeInputExample);
    expect(res.status).toBe(200);
    expect(res.body.basis.length).toBeGreaterThan(0);
  });

  it('when a load has no power, then it is a 422 naming loads/0/powerW', async () => {
    const res = await api.post('/v1/runtime', { usableEnergyWh: 1000, loads: [{ ac: true }] });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors[0].pointer).toBe('#/loads/0/powerW');
  });

  it('when both a pack and usableEnergyWh are sent, then it is a 422 naming usableEnergyWh', async () => {
    const res = await api.post('/v1/runtime', { usableEnergyWh: 1000, pack: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 }, loads: [{ powerW: 10 }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/usableEnergyWh');
  });

  it('when the body is not JSON, then it is a 415 problem', async () => {
    const res = await api.postRaw('/v1/runtime', 'text/plain', 'usableEnergyWh=1000');
    expect(res.status).toBe(415);
    expect(res.body.type).toBe('/problems/unsupported-media-type');
  });
});
