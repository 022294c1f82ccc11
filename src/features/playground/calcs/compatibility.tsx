import { useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { Badge, Num } from '../../../components/ui/data.tsx';
import { formatDuration } from '../../../lib/format.ts';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { CheckboxLike } from '../components/toggle.tsx';
import { FieldGroup, NumberField, SelectField, TextField } from '../components/fields.tsx';
import { chemistryOptions, PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';

const PATH = '/console-api/playground/compatibility/check';
const defaultDcInput = { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500, efficiencyPct: 90 };
const defaultBattery = { chemistry: 'lfp', seriesCells: 16, capacityAh: 40 };

function CompatibilityForm() {
  const { setValue } = useFormContext();
  const [dcInput, battery] = useWatch({ name: ['input.host.dcInput', 'input.host.battery'] }) as [unknown, unknown];
  return (
    <>
      <FieldGroup legend="Host unit">
        <TextField name="input.host.label" label="Label" />
        <div className="space-y-1 sm:col-span-2">
          <CheckboxLike label="It has a DC (solar-style) input" checked={dcInput !== undefined} onChange={(on) => setValue('input.host.dcInput', on ? defaultDcInput : undefined)} />
          <CheckboxLike label="Its own battery can take a pack in parallel" checked={battery !== undefined} onChange={(on) => setValue('input.host.battery', on ? defaultBattery : undefined)} />
        </div>
      </FieldGroup>
      {dcInput !== undefined ? (
        <FieldGroup legend="Host DC input">
          <NumberField name="input.host.dcInput.minVoltageV" label="Lowest input voltage" unit="V" />
          <NumberField name="input.host.dcInput.maxVoltageV" label="Highest input voltage" unit="V" />
          <NumberField name="input.host.dcInput.maxCurrentA" label="Input current limit" unit="A" />
          <NumberField name="input.host.dcInput.maxPowerW" label="Input power limit" unit="W" />
          <NumberField name="input.host.dcInput.efficiencyPct" label="Conversion efficiency" unit="%" />
        </FieldGroup>
      ) : null}
      {battery !== undefined ? (
        <FieldGroup legend="Host battery">
          <SelectField name="input.host.battery.chemistry" label="Chemistry" options={chemistryOptions} />
          <NumberField name="input.host.battery.seriesCells" label="Cells in series" />
          <NumberField name="input.host.battery.capacityAh" label="Capacity" unit="Ah" />
        </FieldGroup>
      ) : null}
      <PackFields base="input.external" legend="External pack" state resistance limits="discharge" />
    </>
  );
}

const verdictTone = { compatible: 'ok', limited: 'warn', incompatible: 'danger' } as const;
const methodName = { dc_input: 'Through the DC input', direct_parallel: 'Directly in parallel with its battery' } as const;

export const compatibility = defineCalc({
  slug: 'compatibility',
  endpoint: '/v1/compatibility/check',
  title: 'External pack compatibility',
  summary: 'Whether an external pack works with a host unit, through its DC input or in parallel.',
  formSchema: z.object({ input: CompatibilityInputSchema }),
  defaults: {
    input: {
      host: { label: 'Hearthstone 1200', dcInput: defaultDcInput, battery: defaultBattery },
      external: { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 100, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 },
    },
  },
  Form: CompatibilityForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <div className="space-y-3">
      <p className="text-sm text-graphite-soft">
        {data.external.label}: <Num value={data.external.openCircuitVoltageV} unit="V" /> now ({data.external.stateOfChargePct.toFixed(0)} %), holding{' '}
        <Num value={data.external.storedEnergyWh} unit="Wh" />.
      </p>
      {data.methods.map((m) => (
        <article key={m.method} className="rounded-lg border border-line bg-white/70 p-4">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h4 className="font-semibold">{methodName[m.method]}</h4>
            <Badge tone={verdictTone[m.verdict]}>{m.verdict}</Badge>
          </div>
          <dl className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
            {m.inputPowerWAtFull !== undefined ? (
              <div>
                <dt className="inline text-graphite-soft">Input power at full: </dt>
                <dd className="inline"><Num value={m.inputPowerWAtFull} unit="W" /></dd>
              </div>
            ) : null}
            {m.inputPowerWAtCutoff !== undefined ? (
              <div>
                <dt className="inline text-graphite-soft">At cut-off: </dt>
                <dd className="inline"><Num value={m.inputPowerWAtCutoff} unit="W" /></dd>
              </div>
            ) : null}
            {m.addedEnergyWh !== undefined ? (
              <div>
                <dt className="inline text-graphite-soft">Energy added: </dt>
                <dd className="inline"><Num value={m.addedEnergyWh} unit="Wh" /></dd>
              </div>
            ) : null}
            {m.hoursToTransfer !== undefined ? (
              <div>
                <dt className="inline text-graphite-soft">Time to transfer: </dt>
                <dd className="inline font-mono">{formatDuration(m.hoursToTransfer)}</dd>
              </div>
            ) : null}
          </dl>
          <ul className="mt-2 list-disc pl-5 text-sm">
            {m.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </article>
      ))}
    </div>
  ),
});
