import { describe, expect, it } from 'vitest';
import { ChargeTimeResultSchema, chargeTimeInputExample } from '#shared/schemas/charge-time.ts';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();
const lfp16 = { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 };

describe('POST /v1/charge/time', () => {
  it('when an 18 A charger fills an empty 100 Ah LFP pack, then it takes about six hours, with a profile and cautions', async () => {
    // Trade fact (common practice): 100 Ah ÷ 18 A ≈ 5.6 h plus a short taper — "about six hours".
    const res = await api.post('/v1/charge/time', { pack: lfp16, fromPct: 0, toPct: 100, sources: [{ currentA: 18 }] });
    expect(res.status).toBe(200);
    expect(ChargeTimeResultSchema.safeParse(res.body).success).toBe(true);
    const d = res.body.data;
    expect(Math.round(d.totalHours)).toBe(6);
    expect(d.chargeCurrentA).toBe(18);
    expect(d.limitedBy).toBe('source');
    expect(d.totalHours).toBeCloseTo(d.constantCurrentHours + d.taperHours, 12);
    expect(d.energyFromSourceWh).toBeGreaterThan(5120);
    expect(d.profile.length).toBeGreaterThan(2);
    expect(d.profile.length).toBeLessThanOrEqual(121);
    expect(Object.keys(d.profile[0]).sort()).toEqual(['currentA', 'minute', 'socPct', 'voltageV']);
    expect(res.body.cautions.join(' ')).toMatch(/local electrical codes/);
  });

  it('when a power source charges, then its current is power × efficiency ÷ the OCV at the start', async () => {
    // The contract's rule for powerW sources; the LFP curve at 50 % is 3.299 V/cell (Sunil et al. 2025,
    // interpolated: reference values §5.2a), so 16 cells give 52.78 V and 900 W gives 17.05 A.
    const res = await api.post('/v1/charge/time', { pack: lfp16, fromPct: 50, toPct: 90, sources: [{ powerW: 1000, efficiencyPct: 90 }] });
    expect(res.status).toBe(200);
    expect(res.body.data.chargeCurrentA).toBeCloseTo(900 / (16 * 3.299), 2);
  });

  it('when the sources exceed the pack limit, then limitedBy is pack_limit', async () => {
    const res = await api.post('/v1/charge/time', chargeTimeInputExample);
    expect(res.status).toBe(200);
    const limited = await api.post('/v1/charge/time', { pack: { ...lfp16, maxChargeA: 20 }, fromPct: 0, toPct: 50, sources: [{ currentA: 40 }] });
    expect(limited.body.data.limitedBy).toBe('pack_limit');
    expect(limited.body.data.chargeCurrentA).toBe(20);
  });

  it('when toPct is not above fromPct, then it is a 422 naming toPct', async () => {
    const res = await api.post('/v1/charge/time', { pack: lfp16, fromPct: 80, toPct: 50, sources: [{ currentA: 10 }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/toPct');
  });

  it('when a source has neither current nor power, then it is a 422 naming that source', async () => {
    const res = await api.post('/v1/charge/time', { pack: lfp16, fromPct: 0, toPct: 50, sources: [{ currentA: 10 }, { efficiencyPct: 90 }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/sources/1');
  });

  it('when no source can charge at all, then it is a 422 calculation error naming sources', async () => {
    const res = await api.post('/v1/charge/time', { pack: lfp16, fromPct: 0, toPct: 50, sources: [{ currentA: 0 }] });
    expect(res.status).toBe(422);
    expect(res.body.type).toBe('/problems/calculation-error');
    expect(res.body.errors[0]).toMatchObject({ pointer: '#/sources', code: 'no_charge_current' });
  });
});
