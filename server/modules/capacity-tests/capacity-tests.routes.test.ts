import { describe, expect, it } from 'vitest';
import { CapacityTestResultSchema, capacityTestCsvExample } from '#shared/schemas/capacity-test.ts';
import { v1Client } from '../../../tests/setup/v1.ts';
import { CSV_LIMIT_BYTES } from './capacity-tests.routes.ts';

const api = v1Client();
const path = '/v1/capacity-tests/evaluate';

describe('POST /v1/capacity-tests/evaluate — JSON', () => {
  it('when 105 Ah is measured on a 100 Ah rating at 20 A, then it is 105 % at 0.2C and passes', async () => {
    // Trade facts (common practice): 105/100 = 105 %; 20 A on 100 Ah = 0.2C.
    const res = await api.post(path, { ratedAh: 100, measuredAh: 105, dischargeCurrentA: 20 });
    expect(res.status).toBe(200);
    expect(CapacityTestResultSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.data).toMatchObject({ measuredAh: 105, verdict: 'pass' });
    expect(res.body.data.stateOfHealthPct).toBeCloseTo(105, 10);
    expect(res.body.data.cRate).toBeCloseTo(0.2, 12);
  });

  it('when capacity is below 80 %, then the verdict is fail with a warning check', async () => {
    const res = await api.post(path, { ratedAh: 100, measuredAh: 70, dischargeCurrentA: 20 });
    expect(res.body.data.verdict).toBe('fail');
    expect(res.body.checks).toContainEqual(expect.objectContaining({ code: 'capacity_below_80_pct', level: 'warning' }));
  });

  it('when samples are sent, then they are integrated (trapezoid: 20 A for 1 h = 20 Ah)', async () => {
    const samples = [0, 900, 1800, 2700, 3600].map((tS) => ({ tS, currentA: -20, voltageV: 12.8 }));
    const res = await api.post(path, { ratedAh: 20, samples });
    expect(res.status).toBe(200);
    expect(res.body.data.measuredAh).toBeCloseTo(20, 10);
    expect(res.body.data.measuredWh).toBeCloseTo(256, 8);
    expect(res.body.data.cRate).toBeCloseTo(1, 10);
  });

  it('when both measuredAh and samples are sent, then it is a 422 naming measuredAh', async () => {
    const res = await api.post(path, { ratedAh: 100, measuredAh: 10, samples: [{ tS: 0, currentA: 1 }, { tS: 1, currentA: 1 }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/measuredAh');
  });

  it('when a sample time goes backwards, then it is a 422 calculation error naming that sample', async () => {
    const res = await api.post(path, { ratedAh: 100, samples: [{ tS: 0, currentA: 1 }, { tS: 10, currentA: 1 }, { tS: 5, currentA: 1 }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/samples/2/tS');
  });
});

describe('POST /v1/capacity-tests/evaluate — text/csv', () => {
  it('when the documented CSV log is sent with ratedAh in the query, then it answers like the JSON samples', async () => {
    // Trapezoid by hand: 20 A for 3 600 s = 20 Ah; Wh = 20 A × ((53.2 + 52.9)/2 × 0.5 h + (52.9 + 52.8)/2 × 0.5 h).
    const res = await api.postRaw(`${path}?ratedAh=20&chemistry=lfp&label=Bench%20run`, 'text/csv', capacityTestCsvExample);
    expect(res.status).toBe(200);
    expect(CapacityTestResultSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.data.label).toBe('Bench run');
    expect(res.body.data.measuredAh).toBeCloseTo(20, 10);
    expect(res.body.data.measuredWh).toBeCloseTo(20 * ((53.2 + 52.9) / 4 + (52.9 + 52.8) / 4), 8);
    expect(res.body.data.sampleCount).toBe(3);
    expect(res.body.data.stateOfHealthPct).toBeCloseTo(100, 10);
  });

  it('when CSV rows are bad, then it is one 422 problem listing each row by number', async () => {
    const csv = 'tS,currentA\n0,20\n60,twenty\n120,20\n90,20\n';
    const res = await api.postRaw(`${path}?ratedAh=100`, 'text/csv', csv);
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.type).toBe('/problems/validation-error');
    expect(res.body.rows).toEqual([
      { row: 3, column: 'currentA', detail: 'Row 3: currentA “twenty” is not a number.' },
      { row: 5, column: 'tS', detail: 'Row 5: tS 90 is not after the previous row’s 120; times must increase.' },
    ]);
    expect(res.body.errors.map((e: { detail: string }) => e.detail)).toEqual(res.body.rows.map((r: { detail: string }) => r.detail));
    expect(res.body.detail).toMatch(/Row 3/);
  });

  it('when the header does not name the columns, then the 422 names row 1', async () => {
    const res = await api.postRaw(`${path}?ratedAh=100`, 'text/csv', 'seconds,amps\n0,1\n1,1\n');
    expect(res.status).toBe(422);
    expect(res.body.rows[0].row).toBe(1);
    expect(res.body.rows[0].detail).toMatch(/tS and currentA/);
  });

  it('when ratedAh is missing from the query, then it is a 400 naming the parameter', async () => {
    const res = await api.postRaw(path, 'text/csv', capacityTestCsvExample);
    expect(res.status).toBe(400);
    expect(res.body.errors[0].parameter).toBe('ratedAh');
  });

  it('when the CSV is larger than the limit, then it is a 413 problem', async () => {
    const row = '1,20,52.1\n';
    const big = `tS,currentA,voltageV\n${row.repeat(Math.ceil(CSV_LIMIT_BYTES / row.length) + 10)}`;
    const res = await api.postRaw(`${path}?ratedAh=100`, 'text/csv', big);
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/payload-too-large');
  });

  it('when the body is neither JSON nor CSV, then it is a 415 naming both accepted types', async () => {
    const res = await api.postRaw(path, 'text/plain', 'hello');
    expect(res.status).toBe(415);
    expect(res.headers['accept-post']).toBe('application/json, text/csv');
  });
});
