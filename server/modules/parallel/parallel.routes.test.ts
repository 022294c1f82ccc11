import { describe, expect, it } from 'vitest';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();
const lfp = (extra: Record<string, unknown>) => ({ chemistry: 'lfp', seriesCells: 16, capacityAh: 100, ...extra });

describe('POST /v1/parallel/share', () => {
  it('when two packs share 100 A, then the bus voltage and each share come back with cautions', async () => {
    const res = await api.post('/v1/parallel/share', {
      packs: [lfp({ label: 'North', stateOfChargePct: 60, internalResistanceMOhm: 8 }), lfp({ label: 'South', stateOfChargePct: 60, internalResistanceMOhm: 12 })],
      load: { currentA: 100 },
    });
    expect(res.status).toBe(200);
    // Current divider: 60 A / 40 A.
    expect(res.body.data.packs.map((p: { label: string; currentA: number }) => [p.label, Math.round(p.currentA)])).toEqual([
      ['North', 60],
      ['South', 40],
    ]);
    expect(res.body.data.loadCurrentA).toBe(100);
    expect(res.body.cautions.join(' ')).toMatch(/Never parallel packs of different chemistry or voltage/);
  });

  it('when a timeline is asked for, then it runs to the first cut-off', async () => {
    const res = await api.post('/v1/parallel/share', {
      packs: [lfp({ stateOfChargePct: 60, internalResistanceMOhm: 8 }), lfp({ stateOfChargePct: 50, internalResistanceMOhm: 8 })],
      load: { powerW: 2500 },
      timeline: true,
    });
    expect(res.status).toBe(200);
    expect(res.body.data.timeToFirstCutoffS).toBeGreaterThan(0);
    expect(res.body.data.timeline.length).toBeGreaterThan(10);
    expect(res.body.data.timeline.length).toBeLessThanOrEqual(201);
  });

  it('when the power exceeds what the packs can deliver, then it is a 422 calculation error naming load.powerW', async () => {
    const res = await api.post('/v1/parallel/share', {
      packs: [lfp({ stateOfChargePct: 50, internalResistanceMOhm: 80 }), lfp({ stateOfChargePct: 50, internalResistanceMOhm: 80 })],
      load: { powerW: 9_000_000 },
    });
    expect(res.status).toBe(422);
    expect(res.body.type).toBe('/problems/calculation-error');
    expect(res.body.errors[0]).toMatchObject({ pointer: '#/load/powerW', code: 'load_exceeds_packs' });
  });

  it('when only one pack or a doubly given load is sent, then it is a 422 naming the field', async () => {
    const one = await api.post('/v1/parallel/share', { packs: [lfp({ internalResistanceMOhm: 8 })], load: { currentA: 10 } });
    expect(one.status).toBe(422);
    expect(one.body.errors[0].pointer).toBe('#/packs');
    const both = await api.post('/v1/parallel/share', { packs: [lfp({ internalResistanceMOhm: 8 }), lfp({ internalResistanceMOhm: 8 })], load: { currentA: 10, powerW: 100 } });
    expect(both.status).toBe(422);
    expect(both.body.errors[0].pointer).toMatch(/^#\/load\//);
  });
});

describe('POST /v1/parallel/connect', () => {
  it('when packs 1.6 V apart are joined through 20 mΩ, then 80 A flows, A − B is positive and the equalization is timed', async () => {
    const res = await api.post('/v1/parallel/connect', {
      packA: lfp({ restingVoltageV: 53.6, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 }),
      packB: lfp({ restingVoltageV: 52.0, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 }),
      link: { resistanceMOhm: 4 },
    });
    expect(res.status).toBe(200);
    const d = res.body.data;
    expect(d.voltageDifferenceV).toBeCloseTo(1.6, 6);
    expect(d.initialCurrentA).toBeCloseTo(80, 3);
    expect(d.verdict).toBe('safe');
    expect(d.recommendedMaxDifferenceV).toBeCloseTo(2, 6);
    expect(d.timeToSettleS).toBeGreaterThan(0);
    expect(d.chargeTransferredAh).toBeGreaterThan(0);
    expect(d.energyLossWh).toBeGreaterThan(0);
    expect(Object.keys(d.timeline[0]).sort()).toEqual(['currentA', 'socAPct', 'socBPct', 'tS']);
    expect(d.precharge).toMatchObject({ needed: false });
  });

  it('when the initial current is above a pack\'s peak, then the verdict is unsafe with a danger check', async () => {
    const res = await api.post('/v1/parallel/connect', {
      packA: lfp({ restingVoltageV: 56, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 }),
      packB: lfp({ restingVoltageV: 50, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 }),
      link: { cable: { size: '2/0 AWG', oneWayLengthFt: 6 } },
    });
    expect(res.status).toBe(200);
    expect(res.body.data.verdict).toBe('unsafe');
    expect(res.body.checks).toContainEqual(expect.objectContaining({ level: 'danger', code: 'inrush_over_peak' }));
    expect(res.body.data.precharge.needed).toBe(true);
    expect(res.body.data.precharge.resistanceOhm).toBeGreaterThan(0);
  });

  it('when the link gives both a resistance and a cable, or a cable without a length, then it is a 422 naming the field', async () => {
    const packs = { packA: lfp({ restingVoltageV: 53, internalResistanceMOhm: 8 }), packB: lfp({ restingVoltageV: 52, internalResistanceMOhm: 8 }) };
    const both = await api.post('/v1/parallel/connect', { ...packs, link: { resistanceMOhm: 3, cable: { size: '2/0', oneWayLengthM: 1 } } });
    expect(both.status).toBe(422);
    expect(both.body.errors[0].pointer).toBe('#/link/cable');
    const noLength = await api.post('/v1/parallel/connect', { ...packs, link: { cable: { size: '2/0' } } });
    expect(noLength.status).toBe(422);
    expect(noLength.body.errors[0].pointer).toBe('#/link/cable/oneWayLengthM');
  });

  it('when a pack is missing, then it is a 422 naming it', async () => {
    const res = await api.post('/v1/parallel/connect', { packA: lfp({ restingVoltageV: 53 }) });
    expect(res.status).toBe(422);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toContain('#/packB');
  });
});
