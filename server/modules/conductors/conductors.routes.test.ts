import { describe, expect, it } from 'vitest';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('GET /v1/reference/conductors', () => {
  it('when the table is requested, then every AWG and metric size comes with area, 20 °C resistance, ampacity by column and sources', async () => {
    const res = await api.get('/v1/reference/conductors');
    expect(res.status).toBe(200);
    const { conductors, sources } = res.body.data;
    expect(conductors).toHaveLength(27); // AWG 18–4/0 (15) and metric 1.5–120 mm² (12)
    const ten = conductors.find((c: { size: string }) => c.size === '10 AWG');
    // NEC 2023 Table 310.16: 10 AWG copper 30/35/40 A; NEC Ch. 9 Table 8: 10 380 cmil = 5.26 mm².
    expect(ten.ampacityA).toEqual({ '60': 30, '75': 35, '90': 40 });
    expect(ten.areaMm2).toBeCloseTo(5.26, 2);
    expect(ten.resistanceOhmPerKm20C).toBeGreaterThan(3.3);
    expect(conductors.map((c: { size: string }) => c.size)).toEqual(expect.arrayContaining(['1/0 AWG', '4/0 AWG', '16 mm²', '120 mm²']));
    expect(sources.join(' ')).toMatch(/2023 edition/);
    expect(sources.join(' ')).toMatch(/IEC 60228/);
    expect(conductors.find((c: { size: string }) => c.size === '16 mm²').ampacityGrade['75']).toBe('derived');
  });

  it('when called without a key, then it is a 401 problem', async () => {
    const { default: request } = await import('supertest');
    const res = await request(api.app).get('/v1/reference/conductors');
    expect(res.status).toBe(401);
  });
});
