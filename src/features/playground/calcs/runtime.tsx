import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { RuntimeInputSchema } from '#shared/schemas/runtime.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { formatDuration } from '../../../lib/format.ts';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { CheckboxField, FieldGroup, NumberField, TextField } from '../components/fields.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/runtime';
const defaultPack = { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 };

function RuntimeForm() {
  const { setValue } = useFormContext();
  const pack = useWatch({ name: 'input.pack' }) as unknown;
  const source = pack === undefined ? 'energy' : 'pack';
  const { fields, append, remove } = useFieldArray({ name: 'input.loads' });
  return (
    <>
      <Segmented
        label="Battery given as"
        value={source}
        options={[
          { value: 'pack', label: 'A pack' },
          { value: 'energy', label: 'Usable energy' },
        ]}
        onChange={(next) => {
          if (next === 'pack') {
            setValue('input.usableEnergyWh', undefined);
            setValue('input.nominalVoltageV', undefined);
            setValue('input.pack', defaultPack);
            setValue('input.depthOfDischargePct', 90);
          } else {
            setValue('input.pack', undefined);
            setValue('input.depthOfDischargePct', undefined);
            setValue('input.usableEnergyWh', 4096);
            setValue('input.nominalVoltageV', 51.2);
          }
        }}
      />
      {source === 'pack' ? (
        <PackFields base="input.pack" legend="Pack" state>
          <NumberField name="input.depthOfDischargePct" label="Depth of discharge" unit="%" hint={describeField(RuntimeInputSchema, 'depthOfDischargePct')} />
        </PackFields>
      ) : (
        <FieldGroup legend="Battery">
          <NumberField name="input.usableEnergyWh" label="Usable energy" unit="Wh" />
          <NumberField name="input.nominalVoltageV" label="Nominal voltage" unit="V" hint={describeField(RuntimeInputSchema, 'nominalVoltageV')} />
        </FieldGroup>
      )}
      {fields.map((f, i) => (
        <FieldGroup
          key={f.id}
          legend={`Load ${i + 1}`}
          actions={
            fields.length > 1 ? (
              <Button tone="quiet" onClick={() => remove(i)}>
                Remove load {i + 1}
              </Button>
            ) : null
          }
        >
          <TextField name={`input.loads.${i}.label`} label="Label" />
          <NumberField name={`input.loads.${i}.powerW`} label="Power while running" unit="W" />
          <NumberField name={`input.loads.${i}.dutyCyclePct`} label="Duty cycle" unit="%" hint="Share of the time it runs; empty: always on." />
          <CheckboxField name={`input.loads.${i}.ac`} label="Runs on AC (through the inverter)" />
        </FieldGroup>
      ))}
      <Button tone="secondary" onClick={() => append({ label: `Load ${fields.length + 1}`, powerW: 50, ac: true })}>
        Add a load
      </Button>
      <FieldGroup legend="Inverter and standing draw">
        <NumberField name="input.inverterEfficiencyPct" label="Inverter efficiency" unit="%" hint={describeField(RuntimeInputSchema, 'inverterEfficiencyPct')} />
        <NumberField name="input.idleDrawW" label="Idle draw" unit="W" hint={describeField(RuntimeInputSchema, 'idleDrawW')} />
      </FieldGroup>
    </>
  );
}

export const runtime = defineCalc({
  slug: 'runtime',
  endpoint: '/v1/runtime',
  title: 'Runtime on a set of loads',
  summary: 'How long a pack runs AC and DC loads, the AC ones through an inverter.',
  formSchema: z.object({ input: RuntimeInputSchema }),
  defaults: {
    input: {
      pack: defaultPack,
      depthOfDischargePct: 90,
      loads: [
        { label: 'Fridge', powerW: 120, dutyCyclePct: 40, ac: true },
        { label: 'Laptop', powerW: 65, ac: true },
        { label: 'DC lights', powerW: 24, ac: false },
      ],
      inverterEfficiencyPct: 90,
      idleDrawW: 15,
    },
  },
  Form: RuntimeForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <StatGrid label="Runtime figures">
      <Stat label="Runtime" emphasis note={`${data.usableEnergyWh.toLocaleString('en-US')} Wh usable ÷ ${data.batteryPowerW.toLocaleString('en-US', { maximumFractionDigits: 1 })} W`}>
        <span className="font-mono">{formatDuration(data.runtimeHours)}</span>
      </Stat>
      <Stat label="Average battery power">
        <Num value={data.batteryPowerW} unit="W" />
      </Stat>
      {data.batteryCurrentA !== undefined ? (
        <Stat label="Average battery current">
          <Num value={data.batteryCurrentA} unit="A" />
        </Stat>
      ) : null}
      <Stat label="Peak battery power" note="Every load on at once.">
        <Num value={data.peakBatteryPowerW} unit="W" />
      </Stat>
      {data.peakBatteryCurrentA !== undefined ? (
        <Stat label="Peak battery current" note="Size wires and fuses for at least this.">
          <Num value={data.peakBatteryCurrentA} unit="A" />
        </Stat>
      ) : null}
      <Stat label="Inverter loss">
        <Num value={data.inverterLossW} unit="W" />
      </Stat>
    </StatGrid>
  ),
});
