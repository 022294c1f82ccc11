import { useId, useRef, useState, type FormEvent } from 'react';
import { catalogCsvColumns, type CatalogKind } from '#shared/schemas/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { catalogPaths } from '../api/catalog-paths.ts';
import { rowErrorsOf, useImportCsv } from '../api/import-csv.ts';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';

/** Uploads a CSV file of one kind; a refused file lists each problem by row and column, and nothing changes. */
export function CsvImport({ kind, canEdit }: { kind: CatalogKind; canEdit: boolean }) {
  const id = useId();
  const fileRef = useRef<HTMLInputElement>(null);
  const [mode, setMode] = useState<'merge' | 'replace'>('merge');
  const upload = useImportCsv();
  const rowErrors = rowErrorsOf(upload.error);
  const label = kind === 'hosts' ? 'host units' : 'packs';

  async function submit(event: FormEvent) {
    event.preventDefault();
    const file = fileRef.current?.files?.[0];
    if (!file) {
      fileRef.current?.focus();
      return;
    }
    await upload.mutateAsync({ kind, mode, file }).catch(() => undefined);
  }

  return (
    <div className="space-y-3">
      <p className="text-sm text-graphite-soft">
        Columns (header row, any order; <code className="font-mono">sku</code> and <code className="font-mono">name</code> required):{' '}
        <code className="font-mono text-xs break-words">{catalogCsvColumns[kind].map((c) => c.column).join(',')}</code>
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <a className="text-sm font-medium text-copper underline" href={catalogPaths.exportCsv(kind)} download>
          Export {label} as CSV
        </a>
      </div>
      {canEdit ? (
        <form onSubmit={submit} className="flex flex-wrap items-end gap-3" aria-label={`Import ${label} from CSV`}>
          <div>
            <label htmlFor={`${id}-file`} className="block text-sm font-medium">
              CSV file of {label}
            </label>
            <input id={`${id}-file`} ref={fileRef} type="file" accept=".csv,text/csv" className="mt-1 block text-sm" />
          </div>
          <div>
            <label htmlFor={`${id}-mode`} className="block text-sm font-medium">
              Rows not in the file
            </label>
            <select id={`${id}-mode`} value={mode} onChange={(e) => setMode(e.target.value as 'merge' | 'replace')} className="mt-1 block rounded-md border border-line bg-white px-3 py-2">
              <option value="merge">Keep them (add and update only)</option>
              <option value="replace">Delete them (the file is the whole list)</option>
            </select>
          </div>
          <Button type="submit" tone="secondary" busy={upload.isPending}>
            Import
          </Button>
        </form>
      ) : null}
      {upload.data ? (
        <Alert tone="ok" title="Imported">
          {upload.data.rows} rows: {upload.data.created} added, {upload.data.updated} updated{upload.data.deleted ? `, ${upload.data.deleted} deleted` : ''}.
        </Alert>
      ) : null}
      {upload.error ? (
        <Alert tone="danger" title="Nothing was imported">
          <p>{upload.error.message}</p>
          {rowErrors.length ? (
            <TableScroll className="mt-2" label="Problems in the file">
              <table className="text-left text-sm">
                <caption className="sr-only">Problems in the file</caption>
                <thead>
                  <tr>
                    <th scope="col" className="pr-4">Row</th>
                    <th scope="col" className="pr-4">Line</th>
                    <th scope="col" className="pr-4">Column</th>
                    <th scope="col">Problem</th>
                  </tr>
                </thead>
                <tbody>
                  {rowErrors.map((e, i) => (
                    <tr key={i}>
                      <td className="pr-4 font-mono">{e.row === 0 ? 'header' : e.row}</td>
                      <td className="pr-4 font-mono">{e.line}</td>
                      <td className="pr-4 font-mono">{e.column ?? '—'}</td>
                      <td>{e.detail}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
          ) : null}
        </Alert>
      ) : null}
    </div>
  );
}
