import { lazy, Suspense, useMemo, useState, type ReactNode } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { Badge, Num } from '../../../components/ui/data.tsx';
import { EmptyState, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { useOrganizationKeys } from '../../../lib/organization-keys.ts';
import { useRequests, type RequestFilters } from '../api/get-requests.ts';
import { useUsage } from '../api/get-usage.ts';

const CallsByDayChart = lazy(() => import('./calls-by-day-chart.tsx'));

/** The last twelve UTC months, newest first, as YYYY-MM. */
function recentMonths(now = new Date()): string[] {
  return Array.from({ length: 12 }, (_, i) => new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - i, 1)).toISOString().slice(0, 7));
}

/** Every day of a month (YYYY-MM) with its calls, zero where none were made. */
function fillDays(month: string, days: Array<{ date: string; calls: number }>) {
  const [y, m] = month.split('-').map(Number);
  const count = new Date(Date.UTC(y!, m!, 0)).getUTCDate();
  const byDate = new Map(days.map((d) => [d.date, d.calls]));
  return Array.from({ length: count }, (_, i) => {
    const date = `${month}-${String(i + 1).padStart(2, '0')}`;
    return { date, calls: byDate.get(date) ?? 0 };
  });
}

export function UsagePage() {
  const months = useMemo(() => recentMonths(), []);
  const [month, setMonth] = useState(months[0]!);
  const usage = useUsage(month);
  return (
    <div className="space-y-8">
      <PageHeader
        title="Usage"
        summary="Every successful calculation call is counted exactly, per key, endpoint and UTC day; that count is what the bill says. Failed calls (4xx) are not counted."
        actions={
          <label className="text-sm">
            Month (UTC)
            <select value={month} onChange={(e) => setMonth(e.target.value)} className="ml-2 rounded-md border border-line bg-white px-2 py-1.5 font-mono">
              {months.map((m) => (
                <option key={m} value={m}>
                  {m}
                </option>
              ))}
            </select>
          </label>
        }
      />
      {usage.isPending ? <LoadingState label="Loading usage…" /> : null}
      {usage.isError ? <ErrorState error={usage.error} onRetry={() => void usage.refetch()} /> : null}
      {usage.data ? (
        <>
          <QuotaMeter used={usage.data.used} quota={usage.data.quota} resetsAt={usage.data.resetsAt} plan={usage.data.plan} ratePerMinute={usage.data.ratePerMinute} />
          <Panel title="Calls by day">
            {usage.data.used === 0 ? (
              <EmptyState title="No calls counted this month.">Make a call from the playground or with a server key; it shows here at once.</EmptyState>
            ) : (
              <Suspense fallback={<LoadingState label="Loading the chart…" />}>
                <CallsByDayChart days={fillDays(usage.data.month, usage.data.byDay)} />
              </Suspense>
            )}
          </Panel>
          <div className="grid gap-6 lg:grid-cols-2">
            <Panel title="By endpoint">
              <Breakdown rows={usage.data.byEndpoint.map((e) => ({ id: e.endpoint, label: <span className="font-mono text-xs">{e.endpoint}</span>, calls: e.calls }))} total={usage.data.used} />
            </Panel>
            <Panel title="By key">
              <Breakdown
                rows={usage.data.byKey.map((k) => ({
                  id: k.keyId,
                  label: (
                    <span>
                      {k.name} <span className="font-mono text-xs text-graphite-soft">{k.displayPrefix}…</span>
                    </span>
                  ),
                  calls: k.calls,
                }))}
                total={usage.data.used}
              />
            </Panel>
          </div>
          <RecentCalls endpoints={usage.data.byEndpoint.map((e) => e.endpoint)} />
        </>
      ) : null}
    </div>
  );
}

function QuotaMeter({ used, quota, resetsAt, plan, ratePerMinute }: { used: number; quota: number; resetsAt: string; plan: string; ratePerMinute: number }) {
  const pct = quota > 0 ? Math.min(100, (used / quota) * 100) : 0;
  const tone = pct >= 100 ? 'danger' : pct >= 80 ? 'warn' : 'ok';
  return (
    <section aria-labelledby="quota-title" className="rounded-lg border border-line bg-white/60 p-5">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="quota-title" className="text-lg font-semibold">
          This month against the plan
        </h2>
        <Badge tone={tone}>{pct >= 100 ? 'quota used up' : pct >= 80 ? 'over 80 %' : 'within quota'}</Badge>
      </div>
      <p className="mt-2 text-sm">
        <Num value={used} maxDecimals={0} /> of <Num value={quota} maxDecimals={0} unit="calls" /> on the <span className="font-medium capitalize">{plan}</span> plan · up to{' '}
        <Num value={ratePerMinute} maxDecimals={0} unit="calls a minute" /> · resets <Time iso={resetsAt} />
      </p>
      <div
        className="mt-3 h-3 w-full overflow-hidden rounded-full bg-paper-deep"
        role="progressbar"
        aria-label="Share of the monthly quota used"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(pct)}
      >
        <div className={`h-full ${tone === 'danger' ? 'bg-danger' : tone === 'warn' ? 'bg-warn' : 'bg-copper'}`} style={{ width: `${pct}%` }} />
      </div>
    </section>
  );
}

function Breakdown({ rows, total }: { rows: Array<{ id: string; label: ReactNode; calls: number }>; total: number }) {
  if (rows.length === 0) return <EmptyState title="Nothing counted yet." />;
  return (
    <table className="w-full text-left text-sm">
      <thead className="border-b border-line text-graphite-soft">
        <tr>
          <th scope="col" className="py-2 pr-3 font-medium">Name</th>
          <th scope="col" className="py-2 pr-3 text-right font-medium">Calls</th>
          <th scope="col" className="py-2 text-right font-medium">Share</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-line/60">
            <td className="py-2 pr-3">{r.label}</td>
            <td className="py-2 pr-3 text-right">
              <Num value={r.calls} maxDecimals={0} />
            </td>
            <td className="py-2 text-right">
              <Num value={total ? (r.calls / total) * 100 : 0} maxDecimals={1} unit="%" />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function RecentCalls({ endpoints }: { endpoints: string[] }) {
  const keys = useOrganizationKeys();
  const [filters, setFilters] = useState<RequestFilters>({});
  const requests = useRequests(filters);
  const items = requests.data?.pages.flatMap((p) => p.items) ?? [];
  const set = (patch: Partial<RequestFilters>) => setFilters((f) => ({ ...f, ...patch }));
  return (
    <Panel title="Recent calls">
      <div className="mb-4 flex flex-wrap gap-3 text-sm" role="group" aria-label="Filter recent calls">
        <label>
          Key
          <select value={filters.keyId ?? ''} onChange={(e) => set({ keyId: e.target.value || undefined })} className="ml-2 rounded-md border border-line bg-white px-2 py-1.5">
            <option value="">any</option>
            {(keys.data ?? []).map((k) => (
              <option key={k.id} value={k.id}>
                {k.name}
              </option>
            ))}
          </select>
        </label>
        <label>
          Endpoint
          <select value={filters.endpoint ?? ''} onChange={(e) => set({ endpoint: e.target.value || undefined })} className="ml-2 rounded-md border border-line bg-white px-2 py-1.5">
            <option value="">any</option>
            {endpoints.map((e) => (
              <option key={e} value={e}>
                {e}
              </option>
            ))}
          </select>
        </label>
        <label>
          Status
          <select value={filters.status ?? ''} onChange={(e) => set({ status: (e.target.value || undefined) as RequestFilters['status'] })} className="ml-2 rounded-md border border-line bg-white px-2 py-1.5">
            <option value="">any</option>
            <option value="2xx">2xx success</option>
            <option value="4xx">4xx client error</option>
            <option value="5xx">5xx server error</option>
          </select>
        </label>
      </div>
      {requests.isPending ? <LoadingState label="Loading recent calls…" /> : null}
      {requests.isError ? <ErrorState error={requests.error} onRetry={() => void requests.refetch()} /> : null}
      {requests.data && items.length === 0 ? <EmptyState title="No calls match.">Calls are kept here for 30 days.</EmptyState> : null}
      {items.length > 0 ? (
        <TableScroll label="Recent calls">
          <table className="w-full min-w-[40rem] text-left text-sm">
            <caption className="sr-only">Recent calls, newest first</caption>
            <thead className="border-b border-line text-graphite-soft">
              <tr>
                <th scope="col" className="py-2 pr-3 font-medium">Time</th>
                <th scope="col" className="py-2 pr-3 font-medium">Key</th>
                <th scope="col" className="py-2 pr-3 font-medium">Endpoint</th>
                <th scope="col" className="py-2 pr-3 font-medium">Status</th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">Duration</th>
                <th scope="col" className="py-2 font-medium">Request id</th>
              </tr>
            </thead>
            <tbody>
              {items.map((r) => (
                <tr key={r.id} className="border-b border-line/60">
                  <td className="py-2 pr-3">
                    <Time iso={r.createdAt} />
                  </td>
                  <td className="py-2 pr-3">{r.keyName ?? '—'}</td>
                  <td className="py-2 pr-3 font-mono text-xs">
                    {r.method} {r.endpoint}
                  </td>
                  <td className="py-2 pr-3">
                    <Badge tone={r.status >= 500 ? 'danger' : r.status >= 400 ? 'warn' : 'ok'}>{r.status}</Badge>
                  </td>
                  <td className="py-2 pr-3 text-right">
                    <Num value={r.durationMs} maxDecimals={0} unit="ms" />
                  </td>
                  <td className="py-2 font-mono text-xs text-graphite-soft">{r.requestId}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
      {requests.hasNextPage ? (
        <Button tone="secondary" className="mt-3" busy={requests.isFetchingNextPage} onClick={() => void requests.fetchNextPage()}>
          Load older calls
        </Button>
      ) : null}
    </Panel>
  );
}
