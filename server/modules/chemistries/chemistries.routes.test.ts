import { describe, expect, it } from 'vitest';
import { ChemistriesResultSchema } from '#shared/schemas/chemistries.ts';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('GET /v1/reference/chemistries', () => {
  it('when the presets are fetched, then each has exactly the contract fields and the contract voltages', async () => {
    const res = await api.get('/v1/reference/chemistries');
    expect(res.status).toBe(200);
    expect(ChemistriesResultSchema.safeParse(res.body).success).toBe(true);
    const list = res.body.data.chemistries as Array<Record<string, unknown>>;
    expect(list.map((c) => c.id)).toEqual(['lfp', 'nmc', 'lto', 'lead_acid_agm', 'lead_acid_flooded']);
    for (const c of list) {
      expect(Object.keys(c).sort()).toEqual(
        ['cutoffCellVoltageV', 'defaultDepthOfDischargePct', 'fullChargeCellVoltageV', 'id', 'name', 'nominalCellVoltageV', 'ocvCurve', 'sources'].sort(),
      );
      expect((c.sources as string[]).length).toBeGreaterThan(0);
      for (const p of c.ocvCurve as Array<Record<string, number>>) expect(Object.keys(p).sort()).toEqual(['cellVoltageV', 'socPct']);
    }
    // The v1 contract's per-cell volts (nominal / full-charge / cut-off), from cell datasheets and lead-acid practice.
    const volts = Object.fromEntries(list.map((c) => [c.id, [c.nominalCellVoltageV, c.fullChargeCellVoltageV, c.cutoffCellVoltageV]]));
    expect(volts).toEqual({
      lfp: [3.2, 3.65, 2.5],
      nmc: [3.7, 4.2, 3.0],
      lto: [2.4, 2.8, 1.5],
      lead_acid_agm: [2.0, 2.4, 1.75],
      lead_acid_flooded: [2.0, 2.4, 1.75],
    });
  });

  it('when called without a key, then it is a 401 problem', async () => {
    const { default: request } = await import('supertest');
    const res = await request(api.app).get('/v1/reference/chemistries');
    expect(res.status).toBe(401);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  });
});
