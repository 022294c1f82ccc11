import { useId, useState, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  name: string;
  error?: string;
  hint?: ReactNode;
}

const inputClass = (error?: string) =>
  `mt-1 block w-full rounded-md border bg-white px-3 py-2 text-graphite shadow-sm ${error ? 'border-danger' : 'border-line'} focus-visible:border-copper`;

function Messages({ id, error, hint }: { id: string; error?: string; hint?: ReactNode }) {
  return (
    <>
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-sm text-graphite-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-danger">
          {error}
        </p>
      ) : null}
    </>
  );
}

const describedBy = (id: string, error?: string, hint?: ReactNode) => [hint ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;

/** A labelled input with its hint and error wired for assistive technology. */
export function Field({ label, name, error, hint, className = '', ...rest }: FieldProps) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <input id={id} name={name} aria-invalid={error ? true : undefined} aria-describedby={describedBy(id, error, hint)} className={inputClass(error)} {...rest} />
      <Messages id={id} error={error} hint={hint} />
    </div>
  );
}

/** A password input with a show/hide switch; paste and password managers work (NIST SP 800-63B-4). */
export function PasswordField({ label, name, error, hint, className = '', ...rest }: FieldProps) {
  const id = useId();
  const [shown, setShown] = useState(false);
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <div className="relative">
        <input
          id={id}
          name={name}
          type={shown ? 'text' : 'password'}
          spellCheck={false}
          autoCapitalize="none"
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(id, error, hint)}
          className={`${inputClass(error)} pr-20`}
          {...rest}
        />
        <button
          type="button"
          onClick={() => setShown((s) => !s)}
          aria-pressed={shown}
          aria-controls={id}
          className="absolute inset-y-0 right-1 my-1 min-w-16 rounded px-2 text-sm text-copper hover:bg-paper-deep"
        >
          {shown ? 'Hide' : 'Show'}
        </button>
      </div>
      <Messages id={id} error={error} hint={hint} />
    </div>
  );
}

interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  name: string;
  error?: string;
  hint?: ReactNode;
  options: ReadonlyArray<{ value: string; label: string }>;
}

export function SelectField({ label, name, error, hint, options, className = '', ...rest }: SelectFieldProps) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <select id={id} name={name} aria-invalid={error ? true : undefined} aria-describedby={describedBy(id, error, hint)} className={inputClass(error)} {...rest}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <Messages id={id} error={error} hint={hint} />
    </div>
  );
}
