import { chemistries, chemistryIds } from '#shared/calc/chemistry/presets.ts';
import { PackSpecSchema } from '#shared/schemas/common.ts';
import type { ReactNode } from 'react';
import { describeField } from '../schema-hints.ts';
import { FieldGroup, NumberField, SelectField, TextField } from './fields.tsx';

export const chemistryOptions = chemistryIds.map((id) => ({ value: id, label: chemistries[id].name }));

const hint = (field: string) => describeField(PackSpecSchema, field);

/** The fields of a pack (PackSpec) under `base`, e.g. "input.pack"; which optional groups to show. */
export function PackFields({
  base,
  legend,
  state = false,
  resistance = false,
  limits = false,
  children,
  actions,
}: {
  base: string;
  legend: string;
  state?: boolean;
  resistance?: boolean;
  limits?: boolean | 'charge' | 'discharge';
  children?: ReactNode;
  actions?: ReactNode;
}) {
  const f = (name: string) => `${base}.${name}`;
  return (
    <FieldGroup legend={legend} actions={actions}>
      <TextField name={f('label')} label="Label" hint="Your name for the pack; echoed in the result." />
      <SelectField name={f('chemistry')} label="Chemistry" options={chemistryOptions} />
      <NumberField name={f('seriesCells')} label="Cells in series" hint={hint('seriesCells')} />
      <NumberField name={f('capacityAh')} label="Capacity" unit="Ah" hint={hint('capacityAh')} />
      {state ? (
        <>
          <NumberField name={f('stateOfChargePct')} label="State of charge" unit="%" hint={hint('stateOfChargePct')} />
          <NumberField name={f('restingVoltageV')} label="Rested voltage" unit="V" hint={hint('restingVoltageV')} />
        </>
      ) : null}
      {resistance ? <NumberField name={f('internalResistanceMOhm')} label="Internal resistance" unit="mΩ" hint={hint('internalResistanceMOhm')} /> : null}
      {limits === true || limits === 'discharge' ? (
        <>
          <NumberField name={f('maxContinuousDischargeA')} label="Max continuous discharge" unit="A" />
          <NumberField name={f('peakDischargeA')} label="Peak discharge" unit="A" hint="Leave empty to take twice the continuous limit." />
        </>
      ) : null}
      {limits === true || limits === 'charge' ? <NumberField name={f('maxChargeA')} label="Max charge current" unit="A" /> : null}
      {children}
    </FieldGroup>
  );
}
