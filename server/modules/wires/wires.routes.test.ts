import { describe, expect, it } from 'vitest';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('POST /v1/wires/size', () => {
  it('when a 20 A continuous lead runs 10 ft on a 48 V pack, then the answer is 10 AWG limited by protection, with cautions and basis', async () => {
    // Trade fact (common practice, no published source): a 20 A DC input lead on a 48 V-class pack is run in 10 AWG.
    const res = await api.post('/v1/wires/size', { currentA: 20, systemVoltageV: 48, oneWayLengthFt: 10 });
    expect(res.status).toBe(200);
    expect(res.body.data.recommended.size).toBe('10 AWG');
    expect(res.body.data.limitedBy).toBe('protection');
    expect(res.body.data.oneWayLengthM).toBeCloseTo(3.048, 4);
    expect(res.body.data.oneWayLengthFt).toBe(10);
    expect(res.body.data.candidates.length).toBe(15);
    expect(res.body.cautions.join(' ')).toMatch(/burns, fire and electric shock/);
    expect(res.body.cautions.join(' ')).toMatch(/local electrical codes/);
    expect(res.body.basis.join(' ')).toMatch(/2023 edition/);
  });

  it('when metric sizes are asked for, then the answer is spelt "… mm²" and the derived ampacity is flagged', async () => {
    const res = await api.post('/v1/wires/size', { currentA: 40, systemVoltageV: 24, oneWayLengthM: 2, sizeSystem: 'metric' });
    expect(res.status).toBe(200);
    expect(res.body.data.recommended.size).toMatch(/^\d+(\.\d+)? mm²$/);
    expect(res.body.checks.map((c: { code: string }) => c.code)).toContain('metric_ampacity_derived');
  });

  it('when nothing in the table can carry the current, then it is still a 200 with recommended null and a danger check', async () => {
    const res = await api.post('/v1/wires/size', { currentA: 400, systemVoltageV: 12, oneWayLengthM: 1 });
    expect(res.status).toBe(200);
    expect(res.body.data.recommended).toBeNull();
    expect(res.body.checks).toContainEqual(expect.objectContaining({ code: 'no_size_fits', level: 'danger' }));
  });

  it('when both lengths are given, then it is a 422 problem naming oneWayLengthFt', async () => {
    const res = await api.post('/v1/wires/size', { currentA: 20, systemVoltageV: 48, oneWayLengthM: 3, oneWayLengthFt: 10 });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors).toContainEqual(expect.objectContaining({ pointer: '#/oneWayLengthFt' }));
  });

  it('when no length is given, then it is a 422 problem naming oneWayLengthM', async () => {
    const res = await api.post('/v1/wires/size', { currentA: 20, systemVoltageV: 48 });
    expect(res.status).toBe(422);
    expect(res.body.errors).toContainEqual(expect.objectContaining({ pointer: '#/oneWayLengthM' }));
  });

  it('when the temperature column is not 60, 75 or 90, or a field is unknown, then it is a 422 naming each field', async () => {
    const res = await api.post('/v1/wires/size', { currentA: 20, systemVoltageV: 48, oneWayLengthM: 3, temperatureRatingC: 105, gauge: 'x' });
    expect(res.status).toBe(422);
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer);
    expect(pointers).toContain('#/temperatureRatingC');
    expect(res.body.detail).toMatch(/temperatureRatingC/);
    expect(JSON.stringify(res.body.errors)).toMatch(/gauge/);
  });

  it('when the current is negative, then it is a 422 naming currentA', async () => {
    const res = await api.post('/v1/wires/size', { currentA: -5, systemVoltageV: 48, oneWayLengthM: 3 });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/currentA');
  });
});
