import { useFormContext, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { FuseSizeInputSchema } from '#shared/schemas/fuse-size.ts';
import { Badge, Num, Stat, StatGrid } from '../../../components/ui/data.tsx';
import { Segmented } from '../../../components/ui/segmented.tsx';
import { runPlayground, type PlaygroundBody } from '../api/run-playground.ts';
import { FieldGroup, NumberField, SelectField, TextField } from '../components/fields.tsx';
import { PackFields } from '../components/pack-fields.tsx';
import { defineCalc } from '../definition.ts';
import { describeField } from '../schema-hints.ts';

const PATH = '/console-api/playground/fuses/size';
const hint = (f: string) => describeField(FuseSizeInputSchema, f);
const defaultSource = { label: 'Fieldbank 12-280', chemistry: 'lfp', seriesCells: 4, capacityAh: 280, internalResistanceMOhm: 2 };
const defaultConductor = { size: '2 AWG', temperatureRatingC: 75 };

function FuseForm() {
  const { setValue } = useFormContext();
  const [conductor, source, known] = useWatch({ name: ['input.conductor', 'input.source', 'input.prospectiveShortCircuitA'] }) as [unknown, unknown, unknown];
  const fault = source !== undefined ? 'pack' : known !== undefined ? 'known' : 'none';
  return (
    <>
      <FieldGroup legend="The circuit">
        <TextField name="input.label" label="Label" />
        <NumberField name="input.continuousCurrentA" label="Continuous current" unit="A" hint={hint('continuousCurrentA')} />
        <NumberField name="input.systemMaxVoltageV" label="Highest circuit voltage" unit="V" hint={hint('systemMaxVoltageV')} />
      </FieldGroup>
      <Segmented
        label="The conductor it protects"
        value={conductor === undefined ? 'none' : 'known'}
        options={[
          { value: 'known', label: 'A known size' },
          { value: 'none', label: 'Not chosen yet' },
        ]}
        onChange={(next) => setValue('input.conductor', next === 'known' ? defaultConductor : undefined)}
      />
      {conductor !== undefined ? (
        <FieldGroup legend="Conductor">
          <TextField name="input.conductor.size" label="Size" hint='AWG as "2 AWG", "1/0"; metric as "35 mm²".' />
          <SelectField
            name="input.conductor.temperatureRatingC"
            label="Insulation temperature column"
            options={[
              { value: 60, label: '60 °C' },
              { value: 75, label: '75 °C' },
              { value: 90, label: '90 °C' },
            ]}
          />
        </FieldGroup>
      ) : null}
      <Segmented
        label="Fault current from"
        value={fault}
        options={[
          { value: 'pack', label: 'The battery' },
          { value: 'known', label: 'A known value' },
          { value: 'none', label: 'Not known' },
        ]}
        onChange={(next) => {
          setValue('input.source', next === 'pack' ? defaultSource : undefined);
          setValue('input.linkResistanceMOhm', next === 'pack' ? 1.27 : undefined);
          setValue('input.prospectiveShortCircuitA', next === 'known' ? 5000 : undefined);
        }}
      />
      {fault === 'pack' ? (
        <PackFields base="input.source" legend="Source battery" resistance>
          <NumberField name="input.linkResistanceMOhm" label="Link resistance" unit="mΩ" hint={hint('linkResistanceMOhm')} />
        </PackFields>
      ) : null}
      {fault === 'known' ? (
        <FieldGroup legend="Fault current">
          <NumberField name="input.prospectiveShortCircuitA" label="Prospective short-circuit current" unit="A" />
        </FieldGroup>
      ) : null}
    </>
  );
}

export const fuseSize = defineCalc({
  slug: 'fuse-size',
  endpoint: '/v1/fuses/size',
  title: 'Size a fuse',
  summary: 'The rating window, and the interrupt and voltage ratings a fault needs.',
  formSchema: z.object({ input: FuseSizeInputSchema }),
  defaults: {
    input: { label: 'Main battery fuse', continuousCurrentA: 80, conductor: defaultConductor, source: defaultSource, linkResistanceMOhm: 1.27 },
  },
  Form: FuseForm,
  run: (keyId, body) => runPlayground(PATH, { keyId, ...body } as PlaygroundBody<typeof PATH>),
  Result: ({ result: { data } }) => (
    <StatGrid label="Fuse figures">
      <Stat label="Recommended rating" emphasis>
        {data.recommendedRatingA === null ? <Badge tone="danger">None fits: see the checks</Badge> : <Num value={data.recommendedRatingA} unit="A" />}
      </Stat>
      <Stat label="Minimum rating" note="125 % of the continuous current, to a standard rating.">
        <Num value={data.minimumRatingA} unit="A" />
      </Stat>
      <Stat label="Maximum rating" note="What the conductor allows.">
        {data.maximumRatingA === null ? <span>no conductor given</span> : <Num value={data.maximumRatingA} unit="A" />}
      </Stat>
      <Stat label="Prospective short-circuit current">
        {data.prospectiveShortCircuitA === null ? <span>not known</span> : <Num value={data.prospectiveShortCircuitA} unit="A" />}
      </Stat>
      <Stat label="Interrupt rating needed" emphasis note={data.preferredInterruptRatingA ? `Nearest preferred rating: ${data.preferredInterruptRatingA.toLocaleString('en-US')} A.` : undefined}>
        {data.requiredInterruptRatingA === null ? <span>not known</span> : <Num value={data.requiredInterruptRatingA} unit="A DC" />}
      </Stat>
      <Stat label="Voltage rating needed">
        {data.requiredVoltageRatingV === null ? <span>not known</span> : <Num value={data.requiredVoltageRatingV} unit="V DC" />}
      </Stat>
    </StatGrid>
  ),
});
