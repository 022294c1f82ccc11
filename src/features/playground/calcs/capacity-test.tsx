import { useId, useMemo } from 'react';
import { useController, useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { parseCapacityLogCsv } from '#shared/calc/capacity-test/capacity-test.ts';
import { packOcvAtSoc } from '#shared/calc/chemistry/pack.ts';
import { CapacityTestInputSchema } from '#shared/schemas/capacity-test.ts';
import { ChemistrySchema } from '#shared/schemas/common.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Badge, Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { formatDuration } from '../../../lib/format.ts';
import { runPlayground, type PlaygroundBody, type PlaygroundResult } from '../api/run-playground.ts';
import { FieldGroup, friendlyMessage, NumberField, SelectField, TextField } from '../components/fields.tsx';
import { CapacityCurveChart } from '../components/lazy-charts.tsx';
import { chemistryOptions } from '../components/pack-fields.tsx';
import { clean, defineCalc, type ResultProps } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/capacity-tests/evaluate';

/** The console API's JSON body limit is 200 kB; the playground keeps the log below it. */
export const PLAYGROUND_CSV_LIMIT_BYTES = 190_000;

const CsvFormSchema = z
  .object({
    fileName: z.string(),
    text: z.string().min(1, 'Choose a CSV log file, or use the sample log'),
    ratedAh: CapacityTestInputSchema.shape.ratedAh,
    chemistry: ChemistrySchema.optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.text) return;
    if (new Blob([v.text]).size > PLAYGROUND_CSV_LIMIT_BYTES) {
      ctx.addIssue({
        code: 'custom',
        path: ['text'],
        message: `This log is larger than the playground takes (${PLAYGROUND_CSV_LIMIT_BYTES / 1000} kB). Send it to the API as text/csv (up to 5 MB): see Copy as code.`,
      });
      return;
    }
    // The same parser the API uses, so row errors show before the call.
    const parsed = parseCapacityLogCsv(v.text);
    if (!parsed.ok) ctx.addIssue({ code: 'custom', path: ['text'], message: parsed.errors.slice(0, 3).map((e) => e.detail).join(' ') });
  });

const FormSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('figures'), input: CapacityTestInputSchema, csv: z.unknown() }),
  z.object({ mode: z.literal('csv'), input: z.unknown(), csv: CsvFormSchema }),
]);

/**
 * An invented log for the demo: a 16-cell LFP pack of 100 Ah (the "Fieldbank 48-100") discharged at 20 A
 * (0.2C) from full for 4.8 h, a sample every 4 minutes; voltage from the LFP open-circuit curve less
 * 20 A × 8 mΩ. It delivers 96 Ah.
 */
export function sampleCapacityLog(): string {
  const pack = { chemistry: 'lfp' as const, seriesCells: 16 };
  const rows = ['tS,currentA,voltageV'];
  const endS = Math.round(4.8 * 3600);
  for (let tS = 0; tS <= endS; tS += 240) {
    const soc = 100 - ((20 * tS) / 3600 / 100) * 100;
    rows.push(`${tS},20,${(packOcvAtSoc(pack, Math.max(0, soc)) - 20 * 0.008).toFixed(3)}`);
  }
  return `${rows.join('\n')}\n`;
}

function CsvPicker() {
  const id = useId();
  const { setValue, trigger } = useFormContext();
  const { fieldState } = useController({ name: 'csv.text' });
  const fileName = useWatch({ name: 'csv.fileName' }) as string;
  const text = useWatch({ name: 'csv.text' }) as string;
  const error = friendlyMessage(fieldState.error?.message);
  const load = (name: string, content: string) => {
    setValue('csv.fileName', name);
    setValue('csv.text', content);
    void trigger('csv.text');
  };
  return (
    <div className="sm:col-span-2">
      <label htmlFor={id} className="block text-sm font-medium">
        Capacity-test log (CSV)
      </label>
      <input
        id={id}
        name="csv.text"
        type="file"
        accept=".csv,text/csv"
        aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}
        aria-invalid={error ? true : undefined}
        onChange={(e) => {
          const file = e.target.files?.[0];
          if (file) void file.text().then((content) => load(file.name, content));
        }}
        className="mt-1 block w-full text-sm file:mr-3 file:min-h-9 file:rounded-md file:border file:border-line file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium"
      />
      <p id={`${id}-hint`} className="mt-1 text-xs text-graphite-soft">
        A header row naming <span className="font-mono">tS,currentA[,voltageV]</span>, then one sample per row (up to {PLAYGROUND_CSV_LIMIT_BYTES / 1000} kB here).
        {text ? (
          <>
            {' '}
            Loaded: <span className="font-mono">{fileName}</span> ({text.split('\n').filter(Boolean).length - 1} rows).
          </>
        ) : null}
      </p>
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-danger">
          {error}
        </p>
      ) : null}
      <Button tone="secondary" className="mt-2" onClick={() => load('fieldbank-48-100-capacity-log.csv', sampleCapacityLog())}>
        Use the sample log
      </Button>
    </div>
  );
}

function CapacityForm() {
  const { setValue, clearErrors } = useFormContext();
  const mode = useWatch({ name: 'mode' }) as 'figures' | 'csv';
  return (
    <>
      <Segmented
        label="Test given as"
        value={mode}
        options={[
          { value: 'figures', label: 'Figures' },
          { value: 'csv', label: 'CSV log upload' },
        ]}
        onChange={(next) => {
          clearErrors();
          setValue('mode', next);
        }}
      />
      {mode === 'figures' ? (
        <FieldGroup legend="The test">
          <TextField name="input.label" label="Label" />
          <SelectField name="input.chemistry" label="Chemistry" options={chemistryOptions} optional="Not given" hint={describeField(CapacityTestInputSchema, 'chemistry')} />
          <NumberField name="input.ratedAh" label="Rated capacity" unit="Ah" />
          <NumberField name="input.measuredAh" label="Measured capacity" unit="Ah" hint={describeField(CapacityTestInputSchema, 'measuredAh')} />
          <NumberField name="input.dischargeCurrentA" label="Discharge current" unit="A" hint={describeField(CapacityTestInputSchema, 'dischargeCurrentA')} />
        </FieldGroup>
      ) : (
        <FieldGroup legend="The log">
          <NumberField name="csv.ratedAh" label="Rated capacity" unit="Ah" />
          <SelectField name="csv.chemistry" label="Chemistry" options={chemistryOptions} optional="Not given" />
          <CsvPicker />
        </FieldGroup>
      )}
    </>
  );
}

const verdictTone = { pass: 'ok', marginal: 'warn', fail: 'danger' } as const;

function CapacityResult({ result: { data }, request }: ResultProps<PlaygroundResult<typeof PATH>>) {
  const csv = request.body.csv as { text: string } | undefined;
  const samples = useMemo(() => {
    if (!csv) return null;
    const parsed = parseCapacityLogCsv(csv.text);
    return parsed.ok ? parsed.samples : null;
  }, [csv]);
  return (
    <>
      <StatGrid label="Capacity test figures">
        <Stat label="Verdict" emphasis note="Pass: at least 90 % of rating; marginal: 80–90 %; fail: below 80 %.">
          <Badge tone={verdictTone[data.verdict]}>{data.verdict}</Badge>
        </Stat>
        <Stat label="State of health" emphasis>
          <Num value={data.stateOfHealthPct} unit="%" />
        </Stat>
        <Stat label="Measured capacity" note={`Rated ${data.ratedAh} Ah.`}>
          <Num value={data.measuredAh} unit="Ah" />
        </Stat>
        {data.measuredWh !== undefined ? (
          <Stat label="Measured energy">
            <Num value={data.measuredWh} unit="Wh" />
          </Stat>
        ) : null}
        <Stat label="Discharge rate">{data.cRate === null ? <span>not known</span> : <Num value={data.cRate} unit="C" />}</Stat>
        {data.durationHours !== undefined ? (
          <Stat label="Test duration">
            <span className="font-mono">{formatDuration(data.durationHours)}</span>
          </Stat>
        ) : null}
      </StatGrid>
      {samples ? <CapacityCurveChart samples={samples} /> : null}
    </>
  );
}

export const capacityTest = defineCalc({
  slug: 'capacity-test',
  endpoint: '/v1/capacity-tests/evaluate',
  title: 'Evaluate a capacity test',
  summary: 'State of health and a verdict, from figures or an uploaded CSV log.',
  formSchema: FormSchema,
  defaults: {
    mode: 'figures',
    input: { label: 'Fieldbank 48-100, unit 0142', chemistry: 'lfp', ratedAh: 100, measuredAh: 96.4, dischargeCurrentA: 20 },
    csv: { fileName: '', text: '', ratedAh: 100, chemistry: 'lfp' },
  },
  Form: CapacityForm,
  toRequest: (values) => {
    if (values.mode === 'csv') {
      const csv = values.csv as { fileName: string; text: string; ratedAh?: number; chemistry?: string };
      const query = clean({ ratedAh: csv.ratedAh, chemistry: csv.chemistry }) as Record<string, string | number>;
      return {
        body: { csv: { text: csv.text, ...query } },
        snippet: { endpoint: '/v1/capacity-tests/evaluate', csv: { fileName: csv.fileName || 'capacity-log.csv', query } },
      };
    }
    const input = clean(values.input) as Record<string, unknown>;
    return { body: { input }, snippet: { endpoint: '/v1/capacity-tests/evaluate', body: input } };
  },
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: CapacityResult,
});
