import { z } from 'zod';
import { PackEnergyInputSchema } from '#shared/schemas/pack-energy.ts';
import { Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { FieldGroup, NumberField, TextField } from '../components/fields.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/packs/energy';

export const packEnergy = defineCalc({
  slug: 'pack-energy',
  endpoint: '/v1/packs/energy',
  title: 'Pack energy and value',
  summary: 'Voltages, energy, usable energy and what a usable kWh costs.',
  formSchema: z.object({ input: PackEnergyInputSchema }),
  defaults: {
    input: {
      pack: { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 },
      depthOfDischargePct: 90,
      price: { amount: 1450, currency: 'USD' },
      cycleLife: 4000,
    },
  },
  Form: () => (
    <>
      <PackFields base="input.pack" legend="Pack" />
      <FieldGroup legend="Use and price">
        <NumberField name="input.depthOfDischargePct" label="Depth of discharge" unit="%" hint={describeField(PackEnergyInputSchema, 'depthOfDischargePct')} />
        <NumberField name="input.cycleLife" label="Rated cycle life" unit="cycles" hint={describeField(PackEnergyInputSchema, 'cycleLife')} />
        <NumberField name="input.price.amount" label="Price" />
        <TextField name="input.price.currency" label="Currency" hint="ISO 4217, e.g. USD." />
      </FieldGroup>
    </>
  ),
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <StatGrid label="Pack figures">
      <Stat label="Usable energy" emphasis note={`${data.depthOfDischargePct} % of ${data.energyWh.toLocaleString('en-US')} Wh`}>
        <Num value={data.usableEnergyWh} unit="Wh" />
      </Stat>
      <Stat label="Energy (nominal)">
        <Num value={data.energyWh} unit="Wh" />
      </Stat>
      <Stat label="Nominal voltage">
        <Num value={data.nominalVoltageV} unit="V" />
      </Stat>
      <Stat label="Full-charge voltage">
        <Num value={data.fullChargeVoltageV} unit="V" />
      </Stat>
      <Stat label="Cut-off voltage">
        <Num value={data.cutoffVoltageV} unit="V" />
      </Stat>
      {data.costPerUsableKWh !== undefined ? (
        <Stat label="Cost per usable kWh" emphasis>
          <Num value={data.costPerUsableKWh} unit={`${data.currency}/kWh`} maxDecimals={2} />
        </Stat>
      ) : null}
      {data.lifetimeThroughputKWh !== undefined ? (
        <Stat label="Lifetime throughput" note="Usable kWh × rated cycles.">
          <Num value={data.lifetimeThroughputKWh} unit="kWh" />
        </Stat>
      ) : null}
      {data.costPerKWhCycled !== undefined ? (
        <Stat label="Cost per kWh cycled">
          <Num value={data.costPerKWhCycled} unit={`${data.currency}/kWh`} maxDecimals={4} />
        </Stat>
      ) : null}
    </StatGrid>
  ),
});
