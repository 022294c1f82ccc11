import { z } from 'zod';
import { mToFeet } from '#shared/calc/units.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import { Badge, Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { useUnitSystem } from '../../../lib/units.ts';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { CheckboxField, FieldGroup, LengthField, NumberField, SelectField, TemperatureField, TextField } from '../components/fields.tsx';
import { WireCandidatesChart } from '../components/lazy-charts.tsx';
import { defineCalc, type ResultProps } from '../definition.ts';
import { describeField } from '../schema-hints.ts';
import type { PlaygroundResult } from '../api/run-playground.ts';

const PATH = '/console-api/playground/wires/size';
const hint = (f: string) => describeField(WireSizeInputSchema, f);

const criterion = { ampacity: 'ampacity', voltage_drop: 'voltage drop', protection: 'overcurrent protection' } as const;

function WireResult({ result: { data }, request }: ResultProps<PlaygroundResult<typeof PATH>>) {
  const units = useUnitSystem();
  const input = (request.body.input ?? {}) as { maxVoltageDropPct?: number };
  const r = data.recommended;
  return (
    <>
      <StatGrid label="Wire figures">
        <Stat label="Recommended size" emphasis note={`Limited by ${criterion[data.limitedBy]}.`}>
          {r ? <span className="font-mono">{r.size}</span> : <Badge tone="danger">None in the table</Badge>}
        </Stat>
        {r ? (
          <>
            <Stat label="Voltage drop (round trip)">
              <Num value={r.voltageDropV} unit="V" /> <span className="text-base text-graphite-soft">(<Num value={r.voltageDropPct} unit="%" />)</span>
            </Stat>
            <Stat label="Ampacity after corrections" note={`Table ${r.ampacityA} A; needs ${data.requiredAmpacityA} A.`}>
              <Num value={r.deratedAmpacityA} unit="A" />
            </Stat>
            <Stat label="Power lost in the wire">
              <Num value={r.powerLossW} unit="W" />
            </Stat>
          </>
        ) : null}
        <Stat label="Fuse the current needs" note="NEC 240.6(A) standard rating.">
          <Num value={data.fuseRatingA} unit="A" />
        </Stat>
        <Stat label="One-way length">
          {units === 'imperial' ? <Num value={mToFeet(data.oneWayLengthM)} unit="ft" /> : <Num value={data.oneWayLengthM} unit="m" />}
        </Stat>
      </StatGrid>
      <WireCandidatesChart
        candidates={data.candidates}
        maxVoltageDropPct={input.maxVoltageDropPct ?? 3}
        requiredAmpacityA={data.requiredAmpacityA}
        recommended={r?.size ?? null}
      />
      <details className="rounded-lg border border-line bg-white/70 p-4 text-sm">
        <summary className="cursor-pointer font-medium">Every size considered ({data.candidates.length})</summary>
        <ul className="mt-2 space-y-2">
          {data.candidates.map((c) => (
            <li key={c.size}>
              <span className="font-mono font-medium">{c.size}</span> {c.passes ? <Badge tone="ok">passes</Badge> : <Badge>fails</Badge>}
              <ul className="ml-4 list-disc text-graphite-soft">
                {c.reasons.map((reason) => (
                  <li key={reason}>{reason}</li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      </details>
    </>
  );
}

export const wireSize = defineCalc({
  slug: 'wire-size',
  endpoint: '/v1/wires/size',
  title: 'Size a DC conductor',
  summary: 'The smallest copper wire for the current, the voltage drop and the fuse.',
  formSchema: z.object({ input: WireSizeInputSchema }),
  units: true,
  defaults: {
    input: {
      label: 'Fieldbank 12-280 to inverter',
      currentA: 60,
      continuous: true,
      systemVoltageV: 12.8,
      oneWayLengthFt: 12,
      maxVoltageDropPct: 3,
      temperatureRatingC: 75,
      ambientTempC: 30,
      currentCarryingConductors: 2,
      sizeSystem: 'awg',
    },
  },
  Form: () => (
    <>
      <FieldGroup legend="The run">
        <TextField name="input.label" label="Label" />
        <NumberField name="input.currentA" label="Current" unit="A" hint={hint('currentA')} />
        <NumberField name="input.systemVoltageV" label="System voltage" unit="V" hint={hint('systemVoltageV')} />
        <LengthField base="input" label="One-way length" hint="The conductor runs there and back." />
        <NumberField name="input.maxVoltageDropPct" label="Largest voltage drop" unit="%" hint={hint('maxVoltageDropPct')} />
        <CheckboxField name="input.continuous" label="Continuous current (3 h or more)" hint="Ampacity must then be at least 125 % of the current." />
      </FieldGroup>
      <FieldGroup legend="Installation">
        <SelectField
          name="input.temperatureRatingC"
          label="Insulation temperature column"
          options={[
            { value: 60, label: '60 °C (140 °F)' },
            { value: 75, label: '75 °C (167 °F)' },
            { value: 90, label: '90 °C (194 °F)' },
          ]}
        />
        <TemperatureField name="input.ambientTempC" label="Ambient temperature" hint="Around the conductor; the API takes it in °C." />
        <NumberField name="input.currentCarryingConductors" label="Current-carrying conductors" hint={hint('currentCarryingConductors')} />
        <SelectField
          name="input.sizeSystem"
          label="Sizes"
          options={[
            { value: 'awg', label: 'AWG' },
            { value: 'metric', label: 'Metric (mm²)' },
          ]}
        />
      </FieldGroup>
    </>
  ),
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: WireResult,
});
