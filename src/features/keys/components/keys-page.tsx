import { useRef, useState, type FormEvent } from 'react';
import { CreateApiKeyInputSchema, type ApiKeyView } from '#shared/schemas/keys.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CodeBlock, CopyButton } from '../../../components/ui/code-block.tsx';
import { Badge } from '../../../components/ui/data.tsx';
import { Field, SelectField } from '../../../components/ui/field.tsx';
import { Alert, EmptyState, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { ApiProblem } from '../../../lib/api-client.ts';
import { maskedKey, useOrganizationKeys } from '../../../lib/organization-keys.ts';
import { useSession } from '../../../lib/session.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useCreateKey } from '../api/create-key.ts';
import { useRevokeKey } from '../api/revoke-key.ts';
import { useRotateKey } from '../api/rotate-key.ts';

type Role = 'owner' | 'admin' | 'developer' | 'viewer';

const statusTone = { active: 'ok', expiring: 'warn', expired: 'info', revoked: 'danger' } as const;

/** Keys: create (the secret shown once), rotate with an overlap, revoke. */
export function KeysPage() {
  const session = useSession();
  const role = session.data?.organization?.role as Role | undefined;
  const userId = session.data?.user.id ?? '';
  const [secret, setSecret] = useState<{ secret: string; apiKey: ApiKeyView; rotated: boolean } | null>(null);
  const canCreate = role === 'owner' || role === 'admin' || role === 'developer';
  return (
    <div className="space-y-8">
      <PageHeader
        title="Keys"
        summary="Server keys authenticate your own software; keep them secret. Embed keys are public and work only from the sites you list, only for calculations."
      />
      {secret ? <NewSecret {...secret} onDone={() => setSecret(null)} /> : null}
      {canCreate ? <CreateKeyPanel onCreated={(s, key) => setSecret({ secret: s, apiKey: key, rotated: false })} /> : null}
      <KeyList
        mayManage={(k) => role === 'owner' || role === 'admin' || (role === 'developer' && k.createdByUserId === userId)}
        onRotated={(s, key) => setSecret({ secret: s, apiKey: key, rotated: true })}
      />
    </div>
  );
}

function NewSecret({ secret, apiKey: key, rotated, onDone }: { secret: string; apiKey: ApiKeyView; rotated: boolean; onDone: () => void }) {
  return (
    <section aria-labelledby="new-secret" className="rounded-lg border-2 border-copper bg-copper-wash/60 p-5">
      <h2 id="new-secret" className="text-lg font-semibold">
        {rotated ? 'The replacement key' : 'Your new key'}: “{key.name}”
      </h2>
      <p className="mt-1 text-sm">
        <strong>Copy it now: this is the only time it is shown.</strong> Ohmstead stores only a keyed hash of it. If it is lost, rotate or revoke it and make a new one.
        {key.kind === 'server' ? ' Keep server keys on your servers, never in web pages or apps you ship.' : ' Embed keys are public by design; they only work from the origins you listed.'}
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <code className="break-all rounded-md border border-line bg-white px-3 py-2 font-mono text-sm" aria-label="The new key">
          {secret}
        </code>
        <CopyButton text={secret} label="Copy key" />
      </div>
      <div className="mt-4">
        <CodeBlock
          label="A first call with this key"
          code={`curl -X POST ${window.location.origin}/v1/packs/energy \\\n  -H "Authorization: Bearer ${secret}" \\\n  -H "Content-Type: application/json" \\\n  -d '{"pack":{"chemistry":"lfp","seriesCells":16,"capacityAh":100}}'`}
        />
      </div>
      <Button tone="secondary" className="mt-4" onClick={onDone}>
        I have stored it
      </Button>
    </section>
  );
}

function CreateKeyPanel({ onCreated }: { onCreated: (secret: string, key: ApiKeyView) => void }) {
  const form = useRef<HTMLFormElement>(null);
  const [kind, setKind] = useState<'server' | 'embed'>('server');
  const { errors, formError, validate, applyProblem, reset } = useZodForm(CreateApiKeyInputSchema);
  const create = useCreateKey();
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const origins = String(data.get('allowedOrigins') ?? '')
      .split(/[\s,]+/)
      .map((o) => o.trim())
      .filter(Boolean);
    const days = String(data.get('expiresInDays') ?? '').trim();
    const input = validate(
      {
        name: String(data.get('name') ?? ''),
        kind,
        ...(kind === 'embed' ? { allowedOrigins: origins } : {}),
        ...(days ? { expiresInDays: Number(days) } : {}),
      },
      event.currentTarget,
    );
    if (!input) return;
    create.mutate(input, {
      onSuccess: (created) => {
        form.current?.reset();
        reset();
        onCreated(created.secret, created.key);
      },
      onError: (error) => applyProblem(error, form.current),
    });
  };
  return (
    <Panel title="Create a key">
      <form ref={form} onSubmit={submit} noValidate className="grid gap-4 md:grid-cols-2">
        <Field label="Name" name="name" required maxLength={80} error={errors.name} hint="What uses it, e.g. “Checkout service” or “Blog widget”." />
        <SelectField
          label="Kind"
          name="kindChoice"
          value={kind}
          onChange={(e) => setKind(e.target.value as 'server' | 'embed')}
          options={[
            { value: 'server', label: 'Server key (secret, for your own servers)' },
            { value: 'embed', label: 'Embed key (public, for widgets on your sites)' },
          ]}
        />
        {kind === 'embed' ? (
          <Field
            label="Allowed origins"
            name="allowedOrigins"
            error={errors.allowedOrigins}
            hint="The sites the key may be used from, as scheme://host[:port], separated by spaces or commas."
            placeholder="https://shop.example"
          />
        ) : null}
        <Field label="Expires after (days, optional)" name="expiresInDays" type="number" min={1} max={3650} inputMode="numeric" error={errors.expiresInDays} />
        {formError ? (
          <div className="md:col-span-2">
            <Alert tone="danger">{formError}</Alert>
          </div>
        ) : null}
        <div className="md:col-span-2">
          <Button type="submit" busy={create.isPending}>
            Create key
          </Button>
        </div>
      </form>
    </Panel>
  );
}

function KeyList({ mayManage, onRotated }: { mayManage: (k: ApiKeyView) => boolean; onRotated: (secret: string, key: ApiKeyView) => void }) {
  const keys = useOrganizationKeys();
  const [showInactive, setShowInactive] = useState(false);
  const visible = (keys.data ?? []).filter((k) => showInactive || k.status === 'active' || k.status === 'expiring');
  return (
    <Panel title="Keys of this organization">
      {keys.isPending ? <LoadingState label="Loading keys…" /> : null}
      {keys.isError ? <ErrorState error={keys.error} onRetry={() => void keys.refetch()} /> : null}
      {keys.data ? (
        <label className="mb-3 inline-flex items-center gap-2 text-sm">
          <input type="checkbox" checked={showInactive} onChange={(e) => setShowInactive(e.target.checked)} className="h-4 w-4 accent-copper" />
          Show revoked and expired keys
        </label>
      ) : null}
      {keys.data && visible.length === 0 ? (
        <EmptyState title="No active keys yet.">Create a server key above to call the API from your software, or an embed key for widgets.</EmptyState>
      ) : null}
      {visible.length > 0 ? (
        <TableScroll label="API keys">
          <table className="w-full min-w-[46rem] text-left text-sm">
            <caption className="sr-only">API keys</caption>
            <thead className="border-b border-line text-graphite-soft">
              <tr>
                <th scope="col" className="py-2 pr-3 font-medium">Name</th>
                <th scope="col" className="py-2 pr-3 font-medium">Key</th>
                <th scope="col" className="py-2 pr-3 font-medium">Status</th>
                <th scope="col" className="py-2 pr-3 font-medium">Created</th>
                <th scope="col" className="py-2 pr-3 font-medium">Last used</th>
                <th scope="col" className="py-2 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {visible.map((k) => (
                <KeyRow key={k.id} apiKey={k} mayManage={mayManage(k)} onRotated={onRotated} />
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
    </Panel>
  );
}

function KeyRow({ apiKey: k, mayManage, onRotated }: { apiKey: ApiKeyView; mayManage: boolean; onRotated: (secret: string, key: ApiKeyView) => void }) {
  const revoke = useRevokeKey();
  const rotate = useRotateKey();
  const [confirming, setConfirming] = useState<'revoke' | 'rotate' | null>(null);
  const [overlapHours, setOverlapHours] = useState(24);
  const active = k.status === 'active' || k.status === 'expiring';
  const error = revoke.error ?? rotate.error;
  return (
    <tr className="border-b border-line/70 align-top">
      <td className="py-3 pr-3">
        <div className="font-medium">{k.name}</div>
        <div className="text-xs text-graphite-soft">{k.kind === 'server' ? 'Server key' : `Embed key · ${k.allowedOrigins.join(', ')}`}</div>
      </td>
      <td className="py-3 pr-3 font-mono text-xs">{maskedKey(k)}</td>
      <td className="py-3 pr-3">
        <Badge tone={statusTone[k.status]}>{k.status}</Badge>
        {k.expiresAt && k.status === 'expiring' ? (
          <div className="mt-1 text-xs text-graphite-soft">
            until <Time iso={k.expiresAt} />
          </div>
        ) : null}
      </td>
      <td className="py-3 pr-3">
        <Time iso={k.createdAt} />
      </td>
      <td className="py-3 pr-3">{k.lastUsedAt ? <Time iso={k.lastUsedAt} /> : <span className="text-graphite-soft">never</span>}</td>
      <td className="py-3">
        {mayManage && active && confirming === null ? (
          <div className="flex flex-wrap gap-2">
            {!k.replacedByKeyId ? (
              <Button tone="secondary" onClick={() => setConfirming('rotate')}>
                Rotate
              </Button>
            ) : null}
            <Button tone="secondary" onClick={() => setConfirming('revoke')}>
              Revoke
            </Button>
          </div>
        ) : null}
        {confirming === 'revoke' ? (
          <div className="max-w-xs space-y-2" role="group" aria-label={`Revoke ${k.name}`}>
            <p className="text-sm">Calls with this key will be refused within seconds, on every server. This cannot be undone.</p>
            <div className="flex gap-2">
              <Button tone="danger" busy={revoke.isPending} onClick={() => revoke.mutate(k.id, { onSuccess: () => setConfirming(null) })}>
                Revoke now
              </Button>
              <Button tone="secondary" onClick={() => setConfirming(null)}>
                Cancel
              </Button>
            </div>
          </div>
        ) : null}
        {confirming === 'rotate' ? (
          <div className="max-w-xs space-y-2" role="group" aria-label={`Rotate ${k.name}`}>
            <label className="block text-sm">
              Keep the old key working for
              <select value={overlapHours} onChange={(e) => setOverlapHours(Number(e.target.value))} className="ml-2 rounded-md border border-line bg-white px-2 py-1">
                <option value={0}>no time (stop now)</option>
                <option value={1}>1 hour</option>
                <option value={24}>24 hours</option>
                <option value={168}>7 days</option>
              </select>
            </label>
            <div className="flex gap-2">
              <Button
                busy={rotate.isPending}
                onClick={() =>
                  rotate.mutate(
                    { id: k.id, overlapHours },
                    {
                      onSuccess: (r) => {
                        setConfirming(null);
                        onRotated(r.secret, r.key);
                      },
                    },
                  )
                }
              >
                Make the replacement
              </Button>
              <Button tone="secondary" onClick={() => setConfirming(null)}>
                Cancel
              </Button>
            </div>
          </div>
        ) : null}
        {error instanceof ApiProblem ? (
          <p role="alert" className="mt-2 text-sm text-danger">
            {error.message}
          </p>
        ) : null}
      </td>
    </tr>
  );
}
