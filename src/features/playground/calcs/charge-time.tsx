import { useFieldArray } from 'react-hook-form';
import { z } from 'zod';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { formatDuration } from '../../../lib/format.ts';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { FieldGroup, NumberField, TextField } from '../components/fields.tsx';
import { ChargeProfileChart } from '../components/lazy-charts.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/charge/time';

function ChargeForm() {
  const { fields, append, remove } = useFieldArray({ name: 'input.sources' });
  return (
    <>
      <PackFields base="input.pack" legend="Pack" resistance limits="charge" />
      <FieldGroup legend="States of charge">
        <NumberField name="input.fromPct" label="From" unit="%" hint={describeField(ChargeTimeInputSchema, 'fromPct')} />
        <NumberField name="input.toPct" label="To" unit="%" hint={describeField(ChargeTimeInputSchema, 'toPct')} />
      </FieldGroup>
      {fields.map((f, i) => (
        <FieldGroup
          key={f.id}
          legend={`Source ${i + 1}`}
          description="A charger by its current, a panel or converter by its power, or both (the lower current applies)."
          actions={
            fields.length > 1 ? (
              <Button tone="quiet" onClick={() => remove(i)}>
                Remove source {i + 1}
              </Button>
            ) : null
          }
        >
          <TextField name={`input.sources.${i}.label`} label="Label" />
          <NumberField name={`input.sources.${i}.currentA`} label="Charge current" unit="A" />
          <NumberField name={`input.sources.${i}.powerW`} label="Power" unit="W" />
          <NumberField name={`input.sources.${i}.efficiencyPct`} label="Efficiency" unit="%" hint="Empty: 100 % (the rating reaches the pack)." />
        </FieldGroup>
      ))}
      {fields.length < 20 ? (
        <Button tone="secondary" onClick={() => append({ label: `Source ${fields.length + 1}`, currentA: 10 })}>
          Add a source
        </Button>
      ) : null}
    </>
  );
}

export const chargeTime = defineCalc({
  slug: 'charge-time',
  endpoint: '/v1/charge/time',
  title: 'Charge time and profile',
  summary: 'How long the chargers take, constant current then taper, with the profile.',
  formSchema: z.object({ input: ChargeTimeInputSchema }),
  defaults: {
    input: {
      pack: { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, maxChargeA: 50, internalResistanceMOhm: 8 },
      fromPct: 20,
      toPct: 100,
      sources: [
        { label: 'Shop charger', currentA: 18 },
        { label: 'Roof panels', powerW: 400, efficiencyPct: 95 },
      ],
    },
  },
  Form: ChargeForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <>
      <StatGrid label="Charge figures">
        <Stat label="Total time" emphasis note={`From ${data.fromPct} % to ${data.toPct} %.`}>
          <span className="font-mono">{formatDuration(data.totalHours)}</span>
        </Stat>
        <Stat label="Constant current">
          <span className="font-mono">{formatDuration(data.constantCurrentHours)}</span>
        </Stat>
        <Stat label="Taper (constant voltage)">
          <span className="font-mono">{formatDuration(data.taperHours)}</span>
        </Stat>
        <Stat label="Charge current" note={data.limitedBy === 'pack_limit' ? "Limited by the pack's max charge current." : 'Set by the sources.'}>
          <Num value={data.chargeCurrentA} unit="A" />
        </Stat>
        <Stat label="Charge voltage">
          <Num value={data.chargeVoltageV} unit="V" />
        </Stat>
        <Stat label="Energy from the sources">
          <Num value={data.energyFromSourceWh} unit="Wh" />
        </Stat>
      </StatGrid>
      <ChargeProfileChart profile={data.profile} />
    </>
  ),
});
