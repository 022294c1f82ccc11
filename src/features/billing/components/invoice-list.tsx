import { EmptyState, ErrorState, LoadingState, Panel } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { useInvoices } from '../api/get-invoices.ts';
import { formatDay, formatMoney } from './format.ts';

/** Invoices from the payment provider, newest first, each linking to its page there. */
export function InvoiceList() {
  const invoices = useInvoices();
  return (
    <Panel title="Invoices">
      {invoices.isPending ? <LoadingState label="Loading invoices…" /> : null}
      {invoices.isError ? <ErrorState error={invoices.error} onRetry={() => void invoices.refetch()} /> : null}
      {invoices.data && invoices.data.items.length === 0 ? <EmptyState title="No invoices yet.">They appear here after the first payment.</EmptyState> : null}
      {invoices.data && invoices.data.items.length > 0 ? (
        <TableScroll label="Invoices">
          <table className="w-full min-w-[36rem] text-left text-sm">
            <caption className="sr-only">Invoices, newest first</caption>
            <thead className="border-b border-line text-graphite-soft">
              <tr>
                <th scope="col" className="py-2 pr-4 font-medium">Invoice</th>
                <th scope="col" className="py-2 pr-4 font-medium">Date</th>
                <th scope="col" className="py-2 pr-4 font-medium">Period</th>
                <th scope="col" className="py-2 pr-4 text-right font-medium">Amount</th>
                <th scope="col" className="py-2 pr-4 font-medium">Status</th>
                <th scope="col" className="py-2 font-medium"><span className="sr-only">Link</span></th>
              </tr>
            </thead>
            <tbody>
              {invoices.data.items.map((inv) => (
                <tr key={inv.id} className="border-b border-line/60">
                  <td className="py-2 pr-4 font-mono">{inv.number ?? inv.id}</td>
                  <td className="py-2 pr-4 font-mono">{formatDay(inv.createdAt)}</td>
                  <td className="py-2 pr-4 font-mono">{inv.periodStart && inv.periodEnd ? `${formatDay(inv.periodStart)} – ${formatDay(inv.periodEnd)}` : '—'}</td>
                  <td className="py-2 pr-4 text-right font-mono">{formatMoney(inv.amountDueCents, inv.currency)}</td>
                  <td className={`py-2 pr-4 ${inv.status === 'open' ? 'font-medium text-danger' : ''}`}>{inv.status ?? '—'}</td>
                  <td className="py-2">
                    {inv.hostedInvoiceUrl ? (
                      <a className="text-copper underline underline-offset-2" href={inv.hostedInvoiceUrl} target="_blank" rel="noopener noreferrer">
                        View<span className="sr-only"> invoice {inv.number ?? inv.id} (opens in a new tab)</span>
                      </a>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
    </Panel>
  );
}
