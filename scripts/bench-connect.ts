/**
 * Benchmark of the connection model: a 10 000-step simulation of two 16S LFP packs equalizing through
 * 20 mΩ (fixed 1 s steps of 4th-order Runge–Kutta on the OCV curves, no early stop), and the full
 * /v1/parallel/connect calculation (adaptive steps, settling, pre-charge run, timeline thinning).
 *
 *   node --import tsx scripts/bench-connect.ts
 *
 * Prints min / median / p95 wall time per run (performance.now), after a warm-up.
 */
import { computeParallelConnect } from '../shared/calc/parallel-connect/parallel-connect.ts';
import { simulateConnection } from '../shared/calc/parallel-connect/simulate.ts';
import { packSource } from '../shared/calc/parallel-share/pack-source.ts';
import { ParallelConnectInputSchema } from '../shared/schemas/parallel-connect.ts';

const STEPS = 10_000;
const RUNS = 200;

function measure(label: string, run: () => unknown): { medianMs: number } {
  for (let i = 0; i < 20; i += 1) run(); // warm-up (JIT)
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const t0 = performance.now();
    run();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const q = (p: number) => times[Math.min(times.length - 1, Math.floor(p * times.length))]!;
  console.log(`${label}: min ${q(0).toFixed(3)} ms · median ${q(0.5).toFixed(3)} ms · p95 ${q(0.95).toFixed(3)} ms  (${RUNS} runs)`);
  return { medianMs: q(0.5) };
}

const a = packSource({ chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 99.9, internalResistanceMOhm: 8 }, 'A');
const b = packSource({ chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 2, internalResistanceMOhm: 8 }, 'B');

const check = simulateConnection(a, b, 0.02, { fixedStepS: 1, maxSteps: STEPS, stopBelowA: 0 });
if (check.steps !== STEPS) throw new Error(`expected ${STEPS} steps, got ${check.steps} (${check.endReason})`);
console.log(`fixed-step run: ${check.steps} steps over ${check.tS.at(-1)} s, current ${check.initialCurrentA.toFixed(1)} A → ${check.currentA.at(-1)!.toFixed(2)} A`);
const fixed = measure(`simulateConnection, ${STEPS} fixed RK4 steps`, () => simulateConnection(a, b, 0.02, { fixedStepS: 1, maxSteps: STEPS, stopBelowA: 0 }));

const input = ParallelConnectInputSchema.parse({
  packA: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100, restingVoltageV: 53.6, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
  packB: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 3, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
  link: { cable: { size: '2/0 AWG', oneWayLengthM: 1.5 } },
  prechargeTargetA: 10,
});
const totalOhm = computeParallelConnect(input).data.totalResistanceMOhm / 1000;
const adaptive = simulateConnection(packSource(input.packA, 'A'), packSource(input.packB, 'B'), totalOhm);
console.log(`adaptive run to settling: ${adaptive.steps} steps, ${adaptive.endReason} at ${adaptive.stopTimeS?.toFixed(0)} s`);
measure('computeParallelConnect (adaptive + pre-charge run)', () => computeParallelConnect(input));

if (fixed.medianMs >= 10) {
  console.error(`FAIL: the ${STEPS}-step simulation took ${fixed.medianMs.toFixed(3)} ms (median), not under 10 ms`);
  process.exitCode = 1;
}
