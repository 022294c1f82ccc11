import { useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { ParallelConnectInputSchema } from '#shared/schemas/parallel-connect.ts';
import { Badge, Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { runPlayground, type PlaygroundBody, type PlaygroundResult } from '../api/run-playground.ts';
import { FieldGroup, LengthField, NumberField, TextField } from '../components/fields.tsx';
import { ConnectionChart } from '../components/lazy-charts.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc, type ResultProps } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/parallel/connect';

const pack = (label: string, restingVoltageV: number) => ({
  label,
  chemistry: 'lfp',
  seriesCells: 16,
  capacityAh: 100,
  restingVoltageV,
  internalResistanceMOhm: 8,
  maxContinuousDischargeA: 100,
  peakDischargeA: 200,
});

function ConnectForm() {
  const { setValue } = useFormContext();
  const cable = useWatch({ name: 'input.link.cable' }) as unknown;
  return (
    <>
      <PackFields base="input.packA" legend="Pack A" state resistance limits />
      <PackFields base="input.packB" legend="Pack B" state resistance limits />
      <Segmented
        label="The link between them"
        value={cable === undefined ? 'resistance' : 'cable'}
        options={[
          { value: 'resistance', label: 'A resistance' },
          { value: 'cable', label: 'A cable' },
        ]}
        onChange={(next) => setValue('input.link', next === 'cable' ? { cable: { size: '2 AWG', oneWayLengthFt: 3 } } : { resistanceMOhm: 4 })}
      />
      <FieldGroup legend="Link">
        {cable === undefined ? (
          <NumberField name="input.link.resistanceMOhm" label="Link resistance" unit="mΩ" hint="Cables, switch and fuse, both poles." />
        ) : (
          <>
            <TextField name="input.link.cable.size" label="Cable size" hint='e.g. "2 AWG" or "35 mm²".' />
            <LengthField base="input.link.cable" label="One-way length" />
          </>
        )}
        <NumberField name="input.prechargeTargetA" label="Pre-charge current target" unit="A" hint={describeField(ParallelConnectInputSchema, 'prechargeTargetA')} />
      </FieldGroup>
    </>
  );
}

const verdictTone = { safe: 'ok', caution: 'warn', unsafe: 'danger' } as const;

function ConnectResult({ result: { data }, request }: ResultProps<PlaygroundResult<typeof PATH>>) {
  const input = (request.body.input ?? {}) as { packA?: { label?: string }; packB?: { label?: string } };
  const labelA = input.packA?.label ?? 'Pack A';
  const labelB = input.packB?.label ?? 'Pack B';
  return (
    <>
      <StatGrid label="Connection figures">
        <Stat label="Verdict" emphasis>
          <Badge tone={verdictTone[data.verdict]}>{data.verdict}</Badge>
        </Stat>
        <Stat label="Initial current" emphasis note={data.peakLimitA !== null ? `Peak limit ${data.peakLimitA} A.` : undefined}>
          <Num value={data.initialCurrentA} unit="A" />
        </Stat>
        <Stat label="Voltage difference (A − B)">
          <Num value={data.voltageDifferenceV} unit="V" />
        </Stat>
        <Stat label="Time to settle" note="Until the current is 1 % of its start.">
          {data.timeToSettleS === null ? <span>not within the simulation</span> : <Num value={data.timeToSettleS} unit="s" />}
        </Stat>
        <Stat label="Charge moved">
          <Num value={data.chargeTransferredAh} unit="Ah" />
        </Stat>
        <Stat label="Heat in the loop">
          <Num value={data.energyLossWh} unit="Wh" />
        </Stat>
        {data.recommendedMaxDifferenceV !== null ? (
          <Stat label="Connect at a difference of at most">
            <Num value={data.recommendedMaxDifferenceV} unit="V" />
          </Stat>
        ) : null}
        {data.precharge ? (
          <Stat label="Pre-charge resistor" note={`${data.precharge.peakPowerW.toLocaleString('en-US', { maximumFractionDigits: 0 })} W peak, ${data.precharge.energyJ.toLocaleString('en-US', { maximumFractionDigits: 0 })} J; bypass at ${data.precharge.bypassAtDifferenceV} V.`}>
            <Num value={data.precharge.resistanceOhm} unit="Ω" />
          </Stat>
        ) : null}
      </StatGrid>
      <ConnectionChart timeline={data.timeline} peakLimitA={data.peakLimitA} continuousLimitA={data.continuousLimitA} labelA={labelA} labelB={labelB} />
    </>
  );
}

export const parallelConnect = defineCalc({
  slug: 'parallel-connect',
  endpoint: '/v1/parallel/connect',
  title: 'Connecting two packs',
  summary: 'The inrush when two packs at different voltages are joined, and a pre-charge resistor.',
  formSchema: z.object({ input: ParallelConnectInputSchema }),
  units: true,
  defaults: { input: { packA: pack('Fieldbank A', 53.6), packB: pack('Fieldbank B', 52.0), link: { resistanceMOhm: 4 }, prechargeTargetA: 10 } },
  Form: ConnectForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ConnectResult,
});
