/**
 * Physical invariants of the calculations, checked through the public API (key, validation, metering,
 * serialization and rounding included) on random valid inputs. The unit tests in shared/calc check the
 * engine itself; these check that what a client receives keeps the same laws:
 *   - parallel/share: the packs' currents sum to the load current (Kirchhoff's current law at the bus);
 *   - packs/energy: energy is linear in capacity and in series cells (E = n·V_cell·Ah);
 *   - wires/size: the recommended conductor never gets smaller as the current or the run length grows;
 *   - parallel/connect: the charge that leaves one pack is the charge that arrives in the other, and
 *     equals chargeTransferredAh (conservation of charge).
 * Tolerances are the rounding of the published fields (4 decimals for currents, 3 for states of charge).
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { v1Client } from '../setup/v1.ts';

const api = v1Client();
let calls = 0;
afterAll(() => console.info(`[fuzz] invariants: ${calls} valid calculation calls through /v1, all 200`));

async function ok(path: string, body: unknown) {
  const res = await api.post(path, body);
  calls += 1;
  expect(res.status, `${path} ${JSON.stringify(body)} → ${JSON.stringify(res.body).slice(0, 400)}`).toBe(200);
  return res.body.data;
}

const chemistry = fc.constantFrom('lfp', 'nmc', 'lto', 'lead_acid_agm', 'lead_acid_flooded');
const lfpPack = fc.record({
  chemistry: fc.constant('lfp'),
  seriesCells: fc.constant(16),
  capacityAh: fc.double({ min: 20, max: 300, noNaN: true }),
  stateOfChargePct: fc.double({ min: 20, max: 90, noNaN: true }),
  internalResistanceMOhm: fc.double({ min: 2, max: 30, noNaN: true }),
});

describe('calculation invariants through the API (random valid inputs, seeded)', () => {
  it('when packs share a load in parallel, then their currents sum to the load current', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.record({ pack: lfpPack, cableResistanceMOhm: fc.double({ min: 0, max: 5, noNaN: true }) }), { minLength: 2, maxLength: 8 }),
        fc.oneof(fc.record({ currentA: fc.double({ min: 1, max: 200, noNaN: true }) }), fc.record({ powerW: fc.double({ min: 100, max: 3_000, noNaN: true }) })),
        async (packs, load) => {
          const data = await ok('/v1/parallel/share', { packs: packs.map((p) => ({ ...p.pack, cableResistanceMOhm: p.cableResistanceMOhm })), load });
          const sum = data.packs.reduce((s: number, p: { currentA: number }) => s + p.currentA, 0);
          // Each current and the load are rounded to 4 decimals: at most 5e-5 A each.
          expect(Math.abs(sum - data.loadCurrentA)).toBeLessThanOrEqual(5e-5 * (packs.length + 1) + 1e-9);
          if ('currentA' in load) expect(data.loadCurrentA).toBeCloseTo(load.currentA, 4);
        },
      ),
      { seed: 1201, numRuns: 40 },
    );
  });

  it('when capacity or series cells are scaled by k, then energy and usable energy scale by exactly k', async () => {
    await fc.assert(
      fc.asyncProperty(
        chemistry,
        fc.integer({ min: 1, max: 24 }),
        fc.double({ min: 1, max: 500, noNaN: true }),
        fc.integer({ min: 2, max: 8 }),
        fc.integer({ min: 10, max: 100 }),
        async (chem, seriesCells, capacityAh, k, depthOfDischargePct) => {
          const base = await ok('/v1/packs/energy', { pack: { chemistry: chem, seriesCells, capacityAh }, depthOfDischargePct });
          const moreAh = await ok('/v1/packs/energy', { pack: { chemistry: chem, seriesCells, capacityAh: capacityAh * k }, depthOfDischargePct });
          const moreCells = await ok('/v1/packs/energy', { pack: { chemistry: chem, seriesCells: seriesCells * k, capacityAh }, depthOfDischargePct });
          for (const scaled of [moreAh, moreCells]) {
            expect(scaled.energyWh / base.energyWh).toBeCloseTo(k, 9);
            expect(scaled.usableEnergyWh / base.usableEnergyWh).toBeCloseTo(k, 9);
          }
          expect(base.usableEnergyWh).toBeCloseTo((base.energyWh * depthOfDischargePct) / 100, 6);
        },
      ),
      { seed: 1202, numRuns: 40 },
    );
  });

  it('when the current or the run length grows, then the recommended wire never gets smaller', async () => {
    const area = (data: { recommended: { areaMm2: number } | null }) => data.recommended?.areaMm2 ?? Number.POSITIVE_INFINITY;
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(12, 24, 48),
        fc.double({ min: 1, max: 250, noNaN: true }),
        fc.double({ min: 1.01, max: 3, noNaN: true }),
        fc.double({ min: 0.3, max: 20, noNaN: true }),
        fc.double({ min: 1.01, max: 4, noNaN: true }),
        fc.constantFrom('awg', 'metric'),
        async (systemVoltageV, currentA, currentFactor, oneWayLengthM, lengthFactor, sizeSystem) => {
          const wire = (i: number, l: number) => ok('/v1/wires/size', { currentA: i, systemVoltageV, oneWayLengthM: l, sizeSystem });
          const base = area(await wire(currentA, oneWayLengthM));
          expect(area(await wire(currentA * currentFactor, oneWayLengthM))).toBeGreaterThanOrEqual(base);
          expect(area(await wire(currentA, oneWayLengthM * lengthFactor))).toBeGreaterThanOrEqual(base);
        },
      ),
      { seed: 1203, numRuns: 30 },
    );
  });

  it('when two packs are connected, then the charge out of one equals the charge into the other and chargeTransferredAh', async () => {
    await fc.assert(
      fc.asyncProperty(lfpPack, lfpPack, fc.double({ min: 0.5, max: 10, noNaN: true }), async (packA, packB, linkMOhm) => {
        fc.pre(Math.abs(packA.stateOfChargePct - packB.stateOfChargePct) > 1);
        const data = await ok('/v1/parallel/connect', { packA, packB, link: { resistanceMOhm: linkMOhm } });
        const outOfA = ((packA.stateOfChargePct - data.finalStateOfChargeAPct) / 100) * packA.capacityAh;
        const intoB = ((data.finalStateOfChargeBPct - packB.stateOfChargePct) / 100) * packB.capacityAh;
        // Final states of charge are published to 3 decimals (±0.0005 %), the charge to 4 (±0.00005 Ah).
        const tolAh = (0.0005 / 100) * Math.max(packA.capacityAh, packB.capacityAh) * 2 + 5e-5;
        expect(Math.abs(outOfA - intoB)).toBeLessThanOrEqual(tolAh);
        // chargeTransferredAh is signed like voltageDifferenceV: positive when charge goes from A to B.
        expect(Math.abs(outOfA - data.chargeTransferredAh)).toBeLessThanOrEqual(tolAh);
        // Charge flows from the higher open-circuit voltage to the lower one.
        expect(Math.sign(outOfA) === Math.sign(data.voltageDifferenceV) || Math.abs(outOfA) <= tolAh).toBe(true);
      }),
      { seed: 1204, numRuns: 30 },
    );
  });
});
