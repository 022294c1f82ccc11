import { useState } from 'react';
import type { CatalogHost, CatalogKind, CatalogPack } from '#shared/schemas/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Alert, EmptyState, ErrorState, LoadingState, PageHeader, Panel } from '../../../components/ui/feedback.tsx';
import { useSession } from '../../../lib/session.ts';
import { useCatalog } from '../api/get-catalog.ts';
import { useDeleteItem } from '../api/save-item.ts';
import { CsvImport } from './csv-import.tsx';
import { ItemForm } from './item-form.tsx';
import { MatrixPanel } from './matrix-panel.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';

const EDITORS = ['owner', 'admin', 'developer'];

/** The organization's host units and packs, by form or CSV, and the compatibility matrix between them. */
export function CatalogPage() {
  const session = useSession();
  const canEdit = EDITORS.includes(session.data?.organization?.role ?? '');
  const catalog = useCatalog();
  return (
    <div className="space-y-8">
      <PageHeader
        title="Catalog"
        summary="The host units and packs you sell. Your widgets offer them to shoppers, and the matrix shows which pack works with which unit."
      />
      {catalog.isPending ? <LoadingState label="Loading the catalog…" /> : null}
      {catalog.isError ? <ErrorState error={catalog.error} onRetry={() => void catalog.refetch()} /> : null}
      {catalog.data ? (
        <>
          <ItemsPanel kind="hosts" items={catalog.data.hosts} canEdit={canEdit} />
          <ItemsPanel kind="packs" items={catalog.data.packs} canEdit={canEdit} />
          <Panel title="Compatibility matrix">
            <MatrixPanel enabled={catalog.data.hosts.length > 0 && catalog.data.packs.length > 0} />
          </Panel>
        </>
      ) : null}
    </div>
  );
}

function describe(kind: CatalogKind, item: CatalogHost | CatalogPack): string {
  if (kind === 'hosts') {
    const h = item as CatalogHost;
    const dc = h.dcInput ? `DC input ${h.dcInput.minVoltageV}–${h.dcInput.maxVoltageV} V, ${h.dcInput.maxCurrentA} A${h.dcInput.maxPowerW ? `, ${h.dcInput.maxPowerW} W` : ''}` : 'no DC input listed';
    const battery = h.battery ? `; ${h.battery.chemistry.toUpperCase()} ${h.battery.seriesCells}S${h.battery.capacityAh ? ` ${h.battery.capacityAh} Ah` : ''}` : '';
    return dc + battery;
  }
  const p = item as CatalogPack;
  return `${p.chemistry.toUpperCase()} ${p.seriesCells}S ${p.capacityAh} Ah${p.price ? `; ${p.price.amount.toLocaleString(undefined, { style: 'currency', currency: p.price.currency })}` : ''}`;
}

function ItemsPanel({ kind, items, canEdit }: { kind: CatalogKind; items: Array<CatalogHost | CatalogPack>; canEdit: boolean }) {
  const [editing, setEditing] = useState<string | 'new' | null>(null);
  const remove = useDeleteItem();
  const title = kind === 'hosts' ? 'Host units' : 'Packs';
  return (
    <Panel title={title}>
      <div className="space-y-5">
        {remove.error ? <Alert tone="danger">{remove.error.message}</Alert> : null}
        {items.length === 0 ? <EmptyState title={`No ${title.toLowerCase()} yet.`}>Add them by form or import a CSV file.</EmptyState> : null}
        {items.length > 0 ? (
          <TableScroll label={`${title}: table`}>
            <table className="w-full min-w-[36rem] text-left text-sm">
              <caption className="sr-only">{title}</caption>
              <thead className="border-b border-line text-graphite-soft">
                <tr>
                  <th scope="col" className="py-2 pr-3 font-medium">SKU</th>
                  <th scope="col" className="py-2 pr-3 font-medium">Name</th>
                  <th scope="col" className="py-2 pr-3 font-medium">Specifications</th>
                  <th scope="col" className="py-2 font-medium"><span className="sr-only">Actions</span></th>
                </tr>
              </thead>
              <tbody>
                {items.map((item) => (
                  <tr key={item.id} className="border-b border-line/60 align-top">
                    <td className="py-2 pr-3 font-mono">{item.sku}</td>
                    <th scope="row" className="py-2 pr-3 font-normal">{item.url ? <a className="text-copper underline" href={item.url}>{item.name}</a> : item.name}</th>
                    <td className="py-2 pr-3 font-mono text-xs">{describe(kind, item)}</td>
                    <td className="py-2 text-right whitespace-nowrap">
                      {canEdit ? (
                        <>
                          <Button tone="quiet" onClick={() => setEditing(item.id)} aria-label={`Edit ${item.name}`}>Edit</Button>
                          <Button tone="quiet" onClick={() => { if (window.confirm(`Delete ${item.name} (${item.sku}) from the catalog?`)) remove.mutate({ kind, id: item.id }); }} aria-label={`Delete ${item.name}`}>
                            Delete
                          </Button>
                        </>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        ) : null}
        {editing ? (
          <div className="rounded-lg border border-line bg-paper p-4">
            <ItemForm key={editing} kind={kind} item={items.find((i) => i.id === editing)} onDone={() => setEditing(null)} />
          </div>
        ) : canEdit ? (
          <Button tone="secondary" onClick={() => setEditing('new')}>{kind === 'hosts' ? 'Add a host unit' : 'Add a pack'}</Button>
        ) : null}
        <CsvImport kind={kind} canEdit={canEdit} />
      </div>
    </Panel>
  );
}
