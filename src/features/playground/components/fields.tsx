/**
 * Form fields bound to react-hook-form by name ("input.pack.capacityAh"), validated by the calculation's
 * shared zod schema through the zod resolver. Each field is labelled, shows its hint (from the schema's
 * own description where there is one) and its error inline, wired with aria-describedby.
 */
import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { useController, useFormContext, useWatch } from 'react-hook-form';
import { celsiusToFahrenheit, fahrenheitToCelsius, feetToM, mToFeet, roundTo } from '#shared/calc/units.ts';
import { useUnitSystem } from '../../../lib/units.ts';

/** zod's messages for a missing or non-numeric number, said plainly. */
export function friendlyMessage(message: string | undefined): string | undefined {
  if (!message) return message;
  if (/expected number, received (NaN|undefined)/.test(message)) return /NaN/.test(message) ? 'Enter a number' : 'Required';
  if (/expected (string|boolean|object|array), received undefined/.test(message)) return 'Required';
  return message;
}

const inputClass = (error?: string) =>
  `mt-1 block w-full rounded-md border bg-white px-3 py-2 font-mono text-sm text-graphite shadow-sm ${error ? 'border-danger' : 'border-line'} focus-visible:border-copper`;

function Frame({ id, label, unit, hint, error, children, className = '' }: { id: string; label: string; unit?: string; hint?: ReactNode; error?: string; children: ReactNode; className?: string }) {
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
        {unit ? <span className="font-normal text-graphite-soft"> ({unit})</span> : null}
      </label>
      {children}
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-graphite-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}

const describedBy = (id: string, hint?: ReactNode, error?: string) => [hint ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;

interface BaseProps {
  name: string;
  label: string;
  hint?: ReactNode;
  className?: string;
}

/**
 * A number: empty means "not given" (undefined), anything else is parsed, and a non-number is left for
 * the schema to report. `toDisplay`/`fromDisplay` convert for unit systems (the form keeps API units).
 */
export function NumberField({
  name,
  label,
  unit,
  hint,
  className,
  toDisplay,
  fromDisplay,
}: BaseProps & { unit?: string; toDisplay?: (v: number) => number; fromDisplay?: (v: number) => number }) {
  const id = useId();
  const { field, fieldState } = useController({ name });
  const error = friendlyMessage(fieldState.error?.message);
  const shown = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? String(toDisplay ? roundTo(toDisplay(v), 2) : v) : '');
  const [text, setText] = useState(() => shown(field.value));
  const lastSet = useRef<unknown>(field.value);
  // Follow changes made from outside (reset, a unit switch): not the ones this input just made.
  useEffect(() => {
    if (field.value !== lastSet.current) {
      lastSet.current = field.value;
      setText(shown(field.value));
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [field.value, toDisplay]);
  return (
    <Frame id={id} label={label} unit={unit} hint={hint} error={error} className={className}>
      <input
        id={id}
        ref={field.ref}
        name={field.name}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        value={text}
        onBlur={field.onBlur}
        onChange={(e) => {
          const raw = e.target.value;
          setText(raw);
          const trimmed = raw.trim().replace(',', '.');
          const parsed = trimmed === '' ? undefined : Number(trimmed);
          const value = parsed !== undefined && Number.isFinite(parsed) && fromDisplay ? fromDisplay(parsed) : parsed;
          lastSet.current = value;
          field.onChange(value);
        }}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={inputClass(error)}
      />
    </Frame>
  );
}

export function TextField({ name, label, hint, className, placeholder }: BaseProps & { placeholder?: string }) {
  const id = useId();
  const { field, fieldState } = useController({ name });
  const error = friendlyMessage(fieldState.error?.message);
  return (
    <Frame id={id} label={label} hint={hint} error={error} className={className}>
      <input
        id={id}
        ref={field.ref}
        name={field.name}
        type="text"
        placeholder={placeholder}
        value={typeof field.value === 'string' ? field.value : ''}
        onBlur={field.onBlur}
        onChange={(e) => field.onChange(e.target.value === '' ? undefined : e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={inputClass(error).replace('font-mono ', '')}
      />
    </Frame>
  );
}

export function SelectField<T extends string | number>({
  name,
  label,
  hint,
  className,
  options,
  optional,
}: BaseProps & { options: ReadonlyArray<{ value: T; label: string }>; optional?: string }) {
  const id = useId();
  const { field, fieldState } = useController({ name });
  const error = friendlyMessage(fieldState.error?.message);
  const numeric = typeof options[0]?.value === 'number';
  return (
    <Frame id={id} label={label} hint={hint} error={error} className={className}>
      <select
        id={id}
        ref={field.ref}
        name={field.name}
        value={field.value === undefined ? '' : String(field.value)}
        onBlur={field.onBlur}
        onChange={(e) => field.onChange(e.target.value === '' ? undefined : numeric ? Number(e.target.value) : e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={inputClass(error).replace('font-mono ', '')}
      >
        {optional !== undefined ? <option value="">{optional}</option> : null}
        {options.map((o) => (
          <option key={String(o.value)} value={String(o.value)}>
            {o.label}
          </option>
        ))}
      </select>
    </Frame>
  );
}

export function CheckboxField({ name, label, hint, className }: BaseProps) {
  const id = useId();
  const { field, fieldState } = useController({ name });
  const error = friendlyMessage(fieldState.error?.message);
  return (
    <div className={className}>
      <div className="flex min-h-9 items-start gap-2">
        <input
          id={id}
          ref={field.ref}
          name={field.name}
          type="checkbox"
          checked={field.value === true}
          onBlur={field.onBlur}
          onChange={(e) => field.onChange(e.target.checked)}
          aria-describedby={describedBy(id, hint, error)}
          className="mt-1 h-4 w-4 accent-copper"
        />
        <label htmlFor={id} className="text-sm font-medium">
          {label}
        </label>
      </div>
      {hint ? (
        <p id={`${id}-hint`} className="ml-6 text-xs text-graphite-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="ml-6 text-sm font-medium text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** A temperature kept in °C (as the API takes it) and shown in °F when imperial units are chosen. */
export function TemperatureField(props: BaseProps) {
  const units = useUnitSystem();
  return units === 'imperial' ? (
    <NumberField key="f" {...props} unit="°F" toDisplay={celsiusToFahrenheit} fromDisplay={fahrenheitToCelsius} />
  ) : (
    <NumberField key="c" {...props} unit="°C" />
  );
}

/**
 * A one-way length under `base` (e.g. "input" or "input.link.cable"): `oneWayLengthM` in metric,
 * `oneWayLengthFt` in imperial (the API takes either, never both). Switching units moves and converts
 * the value.
 */
export function LengthField({ base, label, hint, className }: { base: string; label: string; hint?: ReactNode; className?: string }) {
  const units = useUnitSystem();
  const { getValues, setValue } = useFormContext();
  const m = `${base}.oneWayLengthM`;
  const ft = `${base}.oneWayLengthFt`;
  useWatch({ name: [m, ft] });
  useEffect(() => {
    const [from, to, convert] = units === 'imperial' ? [m, ft, mToFeet] : [ft, m, feetToM];
    const value = getValues(from) as unknown;
    if (typeof value === 'number' && Number.isFinite(value)) {
      setValue(to, roundTo(convert(value), 2), { shouldValidate: false });
      setValue(from, undefined);
    }
  }, [units, m, ft, getValues, setValue]);
  return units === 'imperial' ? (
    <NumberField key="ft" name={ft} label={label} unit="ft" hint={hint} className={className} />
  ) : (
    <NumberField key="m" name={m} label={label} unit="m" hint={hint} className={className} />
  );
}

/** A group of fields with a visible legend. */
export function FieldGroup({ legend, children, actions, description }: { legend: string; children: ReactNode; actions?: ReactNode; description?: ReactNode }) {
  return (
    <fieldset className="rounded-lg border border-line bg-white/50 p-4">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      {description ? <p className="-mt-1 mb-3 text-xs text-graphite-soft">{description}</p> : null}
      <div className="grid gap-4 sm:grid-cols-2">{children}</div>
      {actions ? <div className="mt-3 flex flex-wrap gap-2">{actions}</div> : null}
    </fieldset>
  );
}
