import { useEffect, useMemo, useState } from 'react';
import { widgetTags, type WidgetTag } from '#shared/schemas/widgets.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { ErrorState, LoadingState, PageHeader, Panel } from '../../../components/ui/feedback.tsx';
import { useCatalogForWidgets } from '../api/get-catalog.ts';
import { rememberedKey, useEmbedKeys } from '../api/embed-keys.ts';
import { CreateEmbedKey, OriginsEditor, PasteKey } from './key-panel.tsx';
import { snippet, widgetLabels, widgetUses, type WidgetOptions } from './snippet.ts';
import { WidgetPreview } from './widget-preview.tsx';

/** Pick a widget, set its options, see it live with the real bundle, copy the snippet; the key's sites beside it. */
export function WidgetsPage() {
  const keys = useEmbedKeys();
  const catalog = useCatalogForWidgets();
  const consoleOrigin = window.location.origin;
  const [keyId, setKeyId] = useState<string>('');
  const [secret, setSecret] = useState<string | undefined>();
  const [options, setOptions] = useState<Omit<WidgetOptions, 'key'>>({ tag: 'ohmstead-compatibility', units: 'metric', theme: 'light', catalog: 'organization', hostSku: '', packSku: '' });
  const [copied, setCopied] = useState(false);

  const embedKeys = keys.data ?? [];
  const selected = embedKeys.find((k) => k.id === keyId) ?? embedKeys[0];
  useEffect(() => {
    setSecret(selected ? rememberedKey(selected.id) : undefined);
  }, [selected]);

  const full = useMemo<WidgetOptions | null>(() => (secret ? { ...options, key: secret } : null), [options, secret]);
  const set = <K extends keyof typeof options>(k: K, v: (typeof options)[K]) => setOptions((o) => ({ ...o, [k]: v }));
  const uses = widgetUses[options.tag];
  const code = full ? snippet(full, consoleOrigin) : '';

  return (
    <div className="space-y-8">
      <PageHeader title="Widgets" summary="Calculators for your product pages and articles: one script tag, working only on the sites you list." />
      {keys.isPending ? <LoadingState label="Loading your embed keys…" /> : null}
      {keys.isError ? <ErrorState error={keys.error} onRetry={() => void keys.refetch()} /> : null}
      {keys.data && embedKeys.length === 0 ? (
        <Panel title="Embed key">
          <CreateEmbedKey consoleOrigin={consoleOrigin} />
        </Panel>
      ) : null}
      {selected ? (
        <div className="grid gap-6 xl:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
          <div className="space-y-6">
            <Panel title="Options">
              <div className="space-y-3">
                <SelectField label="Widget" name="tag" value={options.tag} onChange={(e) => set('tag', e.target.value as WidgetTag)} options={widgetTags.map((t) => ({ value: t, label: widgetLabels[t] }))} />
                <SelectField label="Units" name="units" value={options.units} onChange={(e) => set('units', e.target.value as 'metric')} options={[{ value: 'metric', label: 'Metric (m, °C, mm²)' }, { value: 'imperial', label: 'Imperial (ft, °F, AWG)' }]} />
                <SelectField label="Theme" name="theme" value={options.theme} onChange={(e) => set('theme', e.target.value as 'light')} options={[{ value: 'light', label: 'Light' }, { value: 'dark', label: 'Dark' }, { value: 'auto', label: "Follow the visitor's setting" }]} />
                {uses.catalog ? (
                  <SelectField label="Catalog" name="catalog" value={options.catalog} onChange={(e) => set('catalog', e.target.value as 'organization')} options={[{ value: 'organization', label: 'Offer my catalog' }, { value: 'none', label: 'Specifications only' }]} />
                ) : null}
                {uses.hostSku && options.catalog !== 'none' ? (
                  <SelectField label="Preselected unit" name="hostSku" value={options.hostSku} onChange={(e) => set('hostSku', e.target.value)} options={[{ value: '', label: 'The first in the list' }, ...(catalog.data?.hosts ?? []).map((h) => ({ value: h.sku, label: `${h.name} (${h.sku})` }))]} />
                ) : null}
                {uses.packSku && options.catalog !== 'none' ? (
                  <SelectField label="Preselected pack" name="packSku" value={options.packSku} onChange={(e) => set('packSku', e.target.value)} hint="On a product page: that product's SKU." options={[{ value: '', label: 'The first in the list' }, ...(catalog.data?.packs ?? []).map((p) => ({ value: p.sku, label: `${p.name} (${p.sku})` }))]} />
                ) : null}
              </div>
            </Panel>
            <Panel title="Embed key">
              <div className="space-y-4">
                {embedKeys.length > 1 ? (
                  <SelectField label="Key" name="keyId" value={selected.id} onChange={(e) => setKeyId(e.target.value)} options={embedKeys.map((k) => ({ value: k.id, label: `${k.name} (${k.displayPrefix}…${k.last4})` }))} />
                ) : (
                  <p className="text-sm">
                    <span className="font-medium">{selected.name}</span> <span className="font-mono">{selected.displayPrefix}…{selected.last4}</span>
                  </p>
                )}
                {!secret ? <PasteKey keyView={selected} onKnown={setSecret} /> : null}
                <OriginsEditor keyView={selected} consoleOrigin={consoleOrigin} />
              </div>
            </Panel>
          </div>
          <div className="space-y-6">
            <Panel title="Snippet">
              {full ? (
                <div className="space-y-2">
                  <pre className="overflow-x-auto rounded-md bg-graphite p-3 font-mono text-xs text-paper" aria-label="Snippet to paste into your page">
                    <code>{code}</code>
                  </pre>
                  <div className="flex items-center gap-3">
                    <Button
                      tone="secondary"
                      onClick={() =>
                        void navigator.clipboard.writeText(code).then(() => {
                          setCopied(true);
                          setTimeout(() => setCopied(false), 2000);
                        })
                      }
                    >
                      Copy snippet
                    </Button>
                    <span role="status" className="text-sm text-graphite-soft">{copied ? 'Copied.' : ''}</span>
                  </div>
                  <p className="text-sm text-graphite-soft">
                    Pages with a Content-Security-Policy need only <code className="font-mono">script-src {consoleOrigin}</code> (or a nonce) and <code className="font-mono">connect-src {consoleOrigin}</code>. Style it with <code className="font-mono">--ohmstead-accent</code> and friends, or <code className="font-mono">::part(submit)</code>; listen for <code className="font-mono">ohmstead-result</code> events.
                  </p>
                </div>
              ) : (
                <p className="text-sm text-graphite-soft">Paste the key beside to see the snippet and the preview.</p>
              )}
            </Panel>
            <Panel title="Live preview">{full ? <WidgetPreview options={full} refresh={selected.allowedOrigins.join(' ')} /> : <p className="text-sm text-graphite-soft">Waiting for the key.</p>}</Panel>
          </div>
        </div>
      ) : null}
    </div>
  );
}
