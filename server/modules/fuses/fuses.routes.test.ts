import { describe, expect, it } from 'vitest';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('POST /v1/fuses/size', () => {
  it('when a source pack and a conductor are given, then the rating window, short-circuit current and ratings come back', async () => {
    const res = await api.post('/v1/fuses/size', {
      continuousCurrentA: 80,
      conductor: { size: '2' },
      source: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100, internalResistanceMOhm: 8 },
    });
    expect(res.status).toBe(200);
    // NEC 2023 240.6(A) / Table 310.16; I_sc = 58.4 V / 8 mΩ.
    expect(res.body.data).toMatchObject({ minimumRatingA: 100, maximumRatingA: 115, recommendedRatingA: 100, requiredVoltageRatingV: 58.4, requiredInterruptRatingA: 7300 });
    expect(res.body.data.prospectiveShortCircuitA).toBeCloseTo(7300, 6);
    expect(res.body.cautions.join(' ')).toMatch(/as close to the battery terminal as practical/);
  });

  it('when the conductor cannot be protected, then it is a 200 with a danger check', async () => {
    const res = await api.post('/v1/fuses/size', { continuousCurrentA: 20, conductor: { size: '12 AWG' } });
    expect(res.status).toBe(200);
    expect(res.body.data.recommendedRatingA).toBeNull();
    expect(res.body.checks).toContainEqual(expect.objectContaining({ code: 'conductor_unprotectable', level: 'danger' }));
  });

  it.each(['10', '1/0', '16 mm2', '16mm²', '16 mm²', '4/0 AWG'])('when the conductor is written "%s", then it is accepted and returned in the output spelling', async (size) => {
    const res = await api.post('/v1/fuses/size', { continuousCurrentA: 5, conductor: { size } });
    expect(res.status).toBe(200);
    expect(res.body.data.conductor.size).toMatch(/^(\d+|[1-4]\/0) AWG$|^\d+(\.\d+)? mm²$/);
  });

  it('when the conductor size is unknown, then it is a 422 naming conductor.size', async () => {
    const res = await api.post('/v1/fuses/size', { continuousCurrentA: 5, conductor: { size: '5 AWG' } });
    expect(res.status).toBe(422);
    expect(res.body.errors).toContainEqual(expect.objectContaining({ pointer: '#/conductor/size' }));
  });

  it('when both a source and a short-circuit current are given, then it is a 422 naming prospectiveShortCircuitA', async () => {
    const res = await api.post('/v1/fuses/size', {
      continuousCurrentA: 5,
      source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100, internalResistanceMOhm: 2 },
      prospectiveShortCircuitA: 5000,
    });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/prospectiveShortCircuitA');
  });

  it('when the source has no resistance, then it is a 422 calculation error naming source.internalResistanceMOhm', async () => {
    const res = await api.post('/v1/fuses/size', { continuousCurrentA: 5, source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } });
    expect(res.status).toBe(422);
    expect(res.body.type).toBe('/problems/calculation-error');
    expect(res.body.errors[0].pointer).toBe('#/source/internalResistanceMOhm');
  });
});
