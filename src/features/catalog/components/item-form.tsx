import { useState, type FormEvent } from 'react';
import type { CatalogHost, CatalogKind, CatalogPack } from '#shared/schemas/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, SelectField } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { ApiProblem } from '../../../lib/api-client.ts';
import { useSaveItem, type SaveItemInput } from '../api/save-item.ts';
import { chemistryOptions, itemFields, parseItem, valuesOf, type FormValues } from './item-fields.ts';

/** Adds or edits one catalog item; checked with the shared schema before it is sent, and by the server again. */
export function ItemForm({ kind, item, onDone }: { kind: CatalogKind; item?: CatalogHost | CatalogPack; onDone: () => void }) {
  const [values, setValues] = useState<FormValues>(() => valuesOf(kind, item));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useSaveItem();
  const groups = [...new Set(itemFields[kind].map((f) => f.group ?? ''))];

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = parseItem(kind, values);
    setErrors(parsed.errors);
    if (!parsed.item) {
      const first = itemFields[kind].find((f) => parsed.errors[f.path]);
      if (first) (event.currentTarget.elements.namedItem(first.path) as HTMLElement | null)?.focus();
      return;
    }
    try {
      await save.mutateAsync({ kind, id: item?.id, item: parsed.item } as SaveItemInput);
      onDone();
    } catch (error) {
      if (error instanceof ApiProblem) {
        const next: Record<string, string> = {};
        for (const e of error.problem.errors ?? []) next[(e.pointer ?? '').replace(/^#\//, '').replaceAll('/', '.')] = e.detail;
        setErrors(Object.keys(next).length ? next : { '': error.message });
      } else setErrors({ '': 'Something went wrong. Try again.' });
    }
  }

  const field = (path: string) => {
    const f = itemFields[kind].find((x) => x.path === path)!;
    const common = { label: f.label, name: path, error: errors[path], hint: f.hint, value: values[path] ?? '', onChange: (e: { target: { value: string } }) => setValues((v) => ({ ...v, [path]: e.target.value })) };
    if (f.kind === 'chemistry') {
      return <SelectField key={path} {...common} options={kind === 'hosts' ? [{ value: '', label: 'No battery listed' }, ...chemistryOptions] : chemistryOptions} />;
    }
    return <Field key={path} {...common} type={f.kind === 'number' ? 'text' : f.kind === 'url' ? 'url' : 'text'} inputMode={f.kind === 'number' ? 'decimal' : undefined} />;
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={item ? `Edit ${item.name}` : kind === 'hosts' ? 'Add a host unit' : 'Add a pack'}>
      {errors[''] ? <Alert tone="danger">{errors['']}</Alert> : null}
      {groups.map((group) => (
        <fieldset key={group || 'main'} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {group ? <legend className="mb-1 text-sm font-semibold text-graphite-soft">{group}</legend> : null}
          {itemFields[kind].filter((f) => (f.group ?? '') === group).map((f) => field(f.path))}
        </fieldset>
      ))}
      <div className="flex gap-2">
        <Button type="submit" busy={save.isPending}>
          {item ? 'Save changes' : kind === 'hosts' ? 'Add host unit' : 'Add pack'}
        </Button>
        <Button tone="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
