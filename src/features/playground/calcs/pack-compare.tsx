import { useFieldArray } from 'react-hook-form';
import { z } from 'zod';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Num } from '../../../components/ui/data.tsx';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { NumberField, TextField } from '../components/fields.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';

const PATH = '/console-api/playground/packs/compare';

const option = (label: string, chemistry: string, seriesCells: number, capacityAh: number, amount: number, cycleLife: number, depthOfDischargePct?: number) => ({
  label,
  pack: { chemistry, seriesCells, capacityAh },
  ...(depthOfDischargePct ? { depthOfDischargePct } : {}),
  price: { amount, currency: 'USD' },
  cycleLife,
});

function CompareForm() {
  const { fields, append, remove } = useFieldArray({ name: 'input.options' });
  return (
    <>
      {fields.map((f, i) => (
        <PackFields
          key={f.id}
          base={`input.options.${i}.pack`}
          legend={`Option ${i + 1}`}
          actions={
            fields.length > 2 ? (
              <Button tone="quiet" onClick={() => remove(i)}>
                Remove option {i + 1}
              </Button>
            ) : null
          }
        >
          <TextField name={`input.options.${i}.label`} label="Name in the ranking" />
          <NumberField name={`input.options.${i}.depthOfDischargePct`} label="Depth of discharge" unit="%" hint="Empty: the chemistry’s default." />
          <NumberField name={`input.options.${i}.price.amount`} label="Price" />
          <TextField name={`input.options.${i}.price.currency`} label="Currency" />
          <NumberField name={`input.options.${i}.cycleLife`} label="Rated cycle life" unit="cycles" />
        </PackFields>
      ))}
      {fields.length < 20 ? (
        <Button tone="secondary" onClick={() => append(option(`Option ${fields.length + 1}`, 'lfp', 16, 100, 1000, 3000))}>
          Add an option
        </Button>
      ) : null}
    </>
  );
}

export const packCompare = defineCalc({
  slug: 'pack-compare',
  endpoint: '/v1/packs/compare',
  title: 'Compare priced packs',
  summary: 'Rank 2 to 20 priced packs by cost per usable kWh, or per kWh cycled.',
  formSchema: z.object({ input: PackCompareInputSchema }),
  defaults: {
    input: {
      options: [
        option('Fieldbank 48-100', 'lfp', 16, 100, 1450, 4000),
        option('Fieldbank 12-280', 'lfp', 4, 280, 690, 3500),
        option('Tidewell AGM 12-200', 'lead_acid_agm', 6, 200, 420, 600, 50),
      ],
    },
  },
  Form: CompareForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <div className="overflow-x-auto rounded-lg border border-line bg-white/70">
      <table className="w-full text-left text-sm">
        <caption className="px-4 pt-3 text-left text-sm text-graphite-soft">
          Ranked by {data.rankedBy === 'costPerKWhCycled' ? 'cost per kWh cycled over the rated life' : 'cost per usable kWh'} ({data.currency}), best value first.
        </caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="px-4 py-2 font-medium">Rank</th>
            <th scope="col" className="px-4 py-2 font-medium">Option</th>
            <th scope="col" className="px-4 py-2 text-right font-medium">Usable</th>
            <th scope="col" className="px-4 py-2 text-right font-medium">Per usable kWh</th>
            <th scope="col" className="px-4 py-2 text-right font-medium">Per kWh cycled</th>
            <th scope="col" className="px-4 py-2 text-right font-medium">Relative to best</th>
          </tr>
        </thead>
        <tbody>
          {data.options.map((o) => (
            <tr key={o.label} className={`border-b border-line last:border-0 ${o.rank === 1 ? 'bg-copper-wash/50' : ''}`}>
              <td className="px-4 py-2 font-mono">{o.rank}</td>
              <th scope="row" className="px-4 py-2 font-medium">{o.label}</th>
              <td className="px-4 py-2 text-right"><Num value={o.usableEnergyKWh} unit="kWh" /></td>
              <td className="px-4 py-2 text-right"><Num value={o.costPerUsableKWh} maxDecimals={2} /></td>
              <td className="px-4 py-2 text-right"><Num value={o.costPerKWhCycled} maxDecimals={4} /></td>
              <td className="px-4 py-2 text-right"><Num value={o.relativeToBest} unit="×" maxDecimals={2} /></td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  ),
});
