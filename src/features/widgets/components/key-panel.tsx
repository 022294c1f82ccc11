import { useId, useState, type FormEvent } from 'react';
import type { ApiKeyView } from '#shared/schemas/keys.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { matchesKey, rememberKey, useCreateEmbedKey, useUpdateKey } from '../api/embed-keys.ts';

/** Creates the organization's first embed key, its allowed origins starting with this console (for the preview). */
export function CreateEmbedKey({ consoleOrigin }: { consoleOrigin: string }) {
  const create = useCreateEmbedKey();
  const [name, setName] = useState('Widgets');
  const [site, setSite] = useState('');
  async function submit(event: FormEvent) {
    event.preventDefault();
    await create.mutateAsync({ name, allowedOrigins: [consoleOrigin, ...(site.trim() ? [site.trim()] : [])] }).catch(() => undefined);
  }
  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Create an embed key">
      <p className="text-sm text-graphite-soft">Widgets call the API with an embed key, which works only from the sites you list. It starts with this console, so the preview works here.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Key name" name="name" value={name} onChange={(e) => setName(e.target.value)} />
        <Field label="Your site" name="site" placeholder="https://shop.example" hint="Optional now; add more beside the key later." value={site} onChange={(e) => setSite(e.target.value)} />
      </div>
      {create.error ? <Alert tone="danger">{create.error.message}</Alert> : null}
      <Button type="submit" busy={create.isPending}>Create embed key</Button>
    </form>
  );
}

/** When this browser does not hold a key's value (made elsewhere), the owner pastes it once. */
export function PasteKey({ keyView, onKnown }: { keyView: ApiKeyView; onKnown: (secret: string) => void }) {
  const [value, setValue] = useState('');
  const [error, setError] = useState<string>();
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (!matchesKey(keyView, value.trim())) return setError(`That is not ${keyView.name} (${keyView.displayPrefix}…${keyView.last4}).`);
        rememberKey(keyView.id, value.trim());
        onKnown(value.trim());
      }}
    >
      <Field className="min-w-72 flex-1" label={`Paste ${keyView.name} (${keyView.displayPrefix}…${keyView.last4})`} name="embedKey" value={value} error={error} hint="Shown when the key was created. Embed keys are public: this browser keeps it for the snippet." onChange={(e) => setValue(e.target.value)} />
      <Button type="submit" tone="secondary">Use this key</Button>
    </form>
  );
}

/** The key's allowed origins, edited in place (`PATCH /console-api/keys/{id}`); the change applies at once. */
export function OriginsEditor({ keyView, consoleOrigin }: { keyView: ApiKeyView; consoleOrigin: string }) {
  const update = useUpdateKey();
  const [adding, setAdding] = useState('');
  const listId = useId();
  const save = (origins: string[]) => update.mutateAsync({ id: keyView.id, change: { allowedOrigins: origins } }).catch(() => undefined);
  const hasConsole = keyView.allowedOrigins.includes(consoleOrigin);
  return (
    <div className="space-y-3">
      <h3 id={listId} className="font-medium">Sites this key works on</h3>
      <ul aria-labelledby={listId} className="space-y-1">
        {keyView.allowedOrigins.map((o) => (
          <li key={o} className="flex items-center justify-between gap-2 rounded border border-line bg-white px-3 py-1">
            <span className="font-mono text-sm break-all">{o}</span>
            <Button tone="quiet" disabled={keyView.allowedOrigins.length === 1} onClick={() => void save(keyView.allowedOrigins.filter((x) => x !== o))} aria-label={`Remove ${o}`}>
              Remove
            </Button>
          </li>
        ))}
      </ul>
      {!hasConsole ? (
        <Alert tone="warn" title="The preview needs this console on the list">
          <p>The widgets run only on listed sites, and the preview runs here ({consoleOrigin}).</p>
          <Button tone="secondary" className="mt-2" onClick={() => void save([...keyView.allowedOrigins, consoleOrigin])}>Add {consoleOrigin}</Button>
        </Alert>
      ) : null}
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (adding.trim()) void save([...keyView.allowedOrigins, adding.trim()]).then(() => setAdding(''));
        }}
      >
        <Field className="min-w-64 flex-1" label="Add a site" name="origin" placeholder="https://shop.example" hint="scheme://host[:port], no path" value={adding} onChange={(e) => setAdding(e.target.value)} />
        <Button type="submit" tone="secondary" busy={update.isPending}>Add</Button>
      </form>
      {update.error ? <Alert tone="danger">{update.error.message}</Alert> : null}
    </div>
  );
}
