import { useId } from 'react';

/**
 * A choice of a few options shown side by side: a radio group (arrow keys move between options), drawn
 * as a segmented switch.
 */
export function Segmented<T extends string>({
  label,
  value,
  options,
  onChange,
  hideLabel = false,
}: {
  label: string;
  value: T;
  options: ReadonlyArray<{ value: T; label: string }>;
  onChange: (value: T) => void;
  hideLabel?: boolean;
}) {
  const name = useId();
  return (
    <fieldset className="inline-flex flex-wrap items-center gap-2">
      <legend className={hideLabel ? 'sr-only' : 'mb-1 text-sm font-medium'}>{label}</legend>
      <div className="inline-flex rounded-md border border-line bg-white p-0.5">
        {options.map((o) => (
          <label
            key={o.value}
            className={`relative min-h-8 cursor-pointer rounded px-3 py-1.5 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-1 has-[:focus-visible]:outline-copper ${
              value === o.value ? 'bg-graphite font-medium text-white' : 'text-graphite-soft hover:text-graphite'
            }`}
          >
            <input type="radio" className="sr-only" name={name} value={o.value} checked={value === o.value} onChange={() => onChange(o.value)} />
            {o.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
