import { describe, expect, it } from 'vitest';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();
const external = { chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 100, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 };

describe('POST /v1/compatibility/check', () => {
  it('when a 48 V-class pack meets a 12–60 V input and a matching host battery, then both methods are answered with cautions', async () => {
    const res = await api.post('/v1/compatibility/check', {
      host: { dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500 }, battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 40 } },
      external,
    });
    expect(res.status).toBe(200);
    const [dc, direct] = res.body.data.methods;
    expect(dc).toMatchObject({ method: 'dc_input', verdict: 'compatible', inputPowerWAtFull: 500, inputPowerWAtCutoff: 500 });
    expect(dc.addedEnergyWh).toBeGreaterThan(4000);
    expect(dc.hoursToTransfer).toBeGreaterThan(8);
    expect(direct).toMatchObject({ method: 'direct_parallel', verdict: 'compatible' });
    expect(res.body.cautions.join(' ')).toMatch(/burns, fire and electric shock/);
  });

  it('when the pack\'s full charge is above the input maximum, then dc_input is incompatible with a danger check', async () => {
    const res = await api.post('/v1/compatibility/check', { host: { dcInput: { minVoltageV: 12, maxVoltageV: 50, maxCurrentA: 15 } }, external });
    expect(res.status).toBe(200);
    expect(res.body.data.methods[0].verdict).toBe('incompatible');
    expect(res.body.checks).toContainEqual(expect.objectContaining({ level: 'danger' }));
  });

  it('when the input minimum is above the pack\'s cut-off, then dc_input is limited', async () => {
    const res = await api.post('/v1/compatibility/check', { host: { dcInput: { minVoltageV: 45, maxVoltageV: 60, maxCurrentA: 15 } }, external });
    expect(res.body.data.methods[0].verdict).toBe('limited');
  });

  it('when the host is described by neither input nor battery, then it is a 422 naming host.dcInput', async () => {
    const res = await api.post('/v1/compatibility/check', { host: {}, external });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/host/dcInput');
  });

  it('when the input window is upside down, then it is a 422 naming maxVoltageV', async () => {
    const res = await api.post('/v1/compatibility/check', { host: { dcInput: { minVoltageV: 60, maxVoltageV: 12, maxCurrentA: 15 } }, external });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/host/dcInput/maxVoltageV');
  });
});
