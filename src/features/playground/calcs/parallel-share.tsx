import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { ParallelShareInputSchema } from '#shared/schemas/parallel-share.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { formatDuration } from '../../../lib/format.ts';
import { runPlayground, type PlaygroundBody, type PlaygroundResult } from '../api/run-playground.ts';
import { CheckboxField, FieldGroup, NumberField } from '../components/fields.tsx';
import { LoadShareChart } from '../components/lazy-charts.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc, type ResultProps } from '../definition.ts';

const PATH = '/console-api/playground/parallel/share';

const pack = (label: string, soc: number, r: number) => ({
  label,
  chemistry: 'lfp',
  seriesCells: 16,
  capacityAh: 100,
  stateOfChargePct: soc,
  internalResistanceMOhm: r,
  cableResistanceMOhm: 2,
  maxContinuousDischargeA: 100,
});

function ShareForm() {
  const { setValue } = useFormContext();
  const { fields, append, remove } = useFieldArray({ name: 'input.packs' });
  const power = useWatch({ name: 'input.load.powerW' }) as unknown;
  return (
    <>
      {fields.map((f, i) => (
        <PackFields
          key={f.id}
          base={`input.packs.${i}`}
          legend={`Pack ${i + 1}`}
          state
          resistance
          limits="discharge"
          actions={
            fields.length > 2 ? (
              <Button tone="quiet" onClick={() => remove(i)}>
                Remove pack {i + 1}
              </Button>
            ) : null
          }
        >
          <NumberField name={`input.packs.${i}.cableResistanceMOhm`} label="Cable resistance to the bus" unit="mΩ" hint="Both poles together." />
        </PackFields>
      ))}
      {fields.length < 8 ? (
        <Button tone="secondary" onClick={() => append(pack(`Pack ${String.fromCharCode(65 + fields.length)}`, 80, 10))}>
          Add a pack
        </Button>
      ) : null}
      <Segmented
        label="The load"
        value={power === undefined ? 'current' : 'power'}
        options={[
          { value: 'current', label: 'Constant current' },
          { value: 'power', label: 'Constant power' },
        ]}
        onChange={(next) => setValue('input.load', next === 'power' ? { powerW: 3000 } : { currentA: 100 })}
      />
      <FieldGroup legend="Load">
        {power === undefined ? <NumberField name="input.load.currentA" label="Load current" unit="A" /> : <NumberField name="input.load.powerW" label="Load power" unit="W" />}
        <CheckboxField name="input.timeline" label="Also step the discharge in time" hint="Until the first pack reaches its cut-off; adds the timeline chart." />
      </FieldGroup>
    </>
  );
}

function ShareResult({ result: { data }, request }: ResultProps<PlaygroundResult<typeof PATH>>) {
  const packs = ((request.body.input as { packs?: Array<{ maxContinuousDischargeA?: number }> } | undefined)?.packs ?? []) as Array<{ maxContinuousDischargeA?: number }>;
  return (
    <>
      <StatGrid label="Load share figures">
        <Stat label="Bus voltage" emphasis>
          <Num value={data.busVoltageV} unit="V" />
        </Stat>
        <Stat label="Load current">
          <Num value={data.loadCurrentA} unit="A" />
        </Stat>
        <Stat label="Load power">
          <Num value={data.loadPowerW} unit="W" />
        </Stat>
        {data.packs.map((p) => (
          <Stat key={p.label} label={p.label} note={`${p.sharePct.toFixed(1)} % of the load; ${p.resistanceMOhm} mΩ in its path.`}>
            <Num value={p.currentA} unit="A" />
          </Stat>
        ))}
        {data.timeToFirstCutoffH !== null ? (
          <Stat label="Until the first cut-off" note={data.firstCutoffPack ? `${data.firstCutoffPack} reaches it first.` : undefined}>
            <span className="font-mono">{formatDuration(data.timeToFirstCutoffH)}</span>
          </Stat>
        ) : null}
      </StatGrid>
      <LoadShareChart packs={data.packs.map((p, i) => ({ ...p, limitA: packs[i]?.maxContinuousDischargeA }))} timeline={data.timeline} />
    </>
  );
}

export const parallelShare = defineCalc({
  slug: 'parallel-share',
  endpoint: '/v1/parallel/share',
  title: 'Load sharing between parallel packs',
  summary: 'How 2 to 8 packs on one bus share a load, and how the share moves over time.',
  formSchema: z.object({ input: ParallelShareInputSchema }),
  defaults: { input: { packs: [pack('Fieldbank A', 80, 8), pack('Fieldbank B', 70, 12)], load: { currentA: 100 }, timeline: true } },
  Form: ShareForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ShareResult,
});
