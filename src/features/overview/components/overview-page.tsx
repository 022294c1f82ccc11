import { Link } from 'react-router';
import { CodeTabs } from '../../../components/ui/code-block.tsx';
import { Num } from '../../../components/ui/data.tsx';
import { EmptyState, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { maskedKey, useChosenServerKey, useOrganizationKeys } from '../../../lib/organization-keys.ts';
import { useSession } from '../../../lib/session.ts';
import { buildSnippets } from '../../../lib/code-snippets.ts';
import { useRecentErrors, useUsage } from '../api/get-overview.ts';
import { firstRunSteps } from '../first-run.ts';

const firstCallBody = { pack: { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, depthOfDischargePct: 90 };

function FirstRun() {
  const keys = useOrganizationKeys();
  const usage = useUsage();
  if (keys.isPending || usage.isPending) return <LoadingState label="Checking your first steps…" />;
  if (keys.isError || usage.isError) return <ErrorState error={keys.error ?? usage.error} onRetry={() => void Promise.all([keys.refetch(), usage.refetch()])} />;
  const steps = firstRunSteps(keys.data, usage.data);
  const remaining = steps.filter((s) => !s.done).length;
  return (
    <Panel title={remaining === 0 ? 'You are set up' : 'Get started'}>
      <p className="text-sm text-graphite-soft">
        {remaining === 0 ? 'All three first steps are done.' : `${3 - remaining} of 3 done. Each step ticks itself off when it has happened.`}
      </p>
      <ol className="mt-4 grid gap-3 md:grid-cols-3">
        {steps.map((s, i) => (
          <li key={s.id} data-step={s.id} data-done={s.done} className={`rounded-lg border p-4 ${s.done ? 'border-ok/40 bg-[#eef5ef]' : 'border-line bg-white/70'}`}>
            <p className="flex items-center gap-2 font-semibold">
              <span aria-hidden="true" className={`inline-flex h-6 w-6 items-center justify-center rounded-full text-xs ${s.done ? 'bg-ok text-white' : 'border border-graphite-soft text-graphite'}`}>
                {s.done ? '✓' : i + 1}
              </span>
              {s.title}
              <span className="sr-only">{s.done ? ' (done)' : ' (to do)'}</span>
            </p>
            <p className="mt-1 text-sm text-graphite-soft">{s.description}</p>
            {s.done ? (
              <p className="mt-2 text-sm font-medium text-ok">Done</p>
            ) : (
              <Link to={s.action.to} className="mt-2 inline-block text-sm font-medium text-copper underline underline-offset-2">
                {s.action.label}
              </Link>
            )}
          </li>
        ))}
      </ol>
    </Panel>
  );
}

function MonthUsage() {
  const usage = useUsage();
  if (usage.isPending) return <LoadingState label="Loading this month’s usage…" />;
  if (usage.isError) return <ErrorState error={usage.error} onRetry={() => void usage.refetch()} />;
  const u = usage.data;
  const pct = u.quota > 0 ? Math.min(100, (u.used / u.quota) * 100) : 0;
  const top = u.byEndpoint.slice(0, 5);
  return (
    <Panel title="This month">
      <p className="text-sm text-graphite-soft">
        Plan <span className="font-medium capitalize text-graphite">{u.plan}</span> · <Num value={u.ratePerMinute} unit="calls/min" /> · resets <Time iso={u.resetsAt} />
      </p>
      <p className="mt-3 text-2xl font-medium">
        <span className="font-mono">{u.used.toLocaleString('en-US')}</span>
        <span className="text-base text-graphite-soft"> of {u.quota.toLocaleString('en-US')} calls</span>
      </p>
      <div
        role="progressbar"
        aria-label="Calls used this month"
        aria-valuemin={0}
        aria-valuemax={u.quota}
        aria-valuenow={u.used}
        aria-valuetext={`${u.used} of ${u.quota} calls (${pct.toFixed(1)} %)`}
        className="mt-2 h-3 w-full overflow-hidden rounded-full bg-paper-deep ring-1 ring-line"
      >
        <div className={`h-full ${pct >= 100 ? 'bg-danger' : pct >= 80 ? 'bg-warn' : 'bg-copper'}`} style={{ width: `${pct}%` }} />
      </div>
      <p className="mt-1 text-sm text-graphite-soft">
        <span className="font-mono">{u.remaining.toLocaleString('en-US')}</span> left ({pct.toFixed(1)} % used).
      </p>
      {top.length ? (
        <div className="mt-4">
          <h3 className="text-sm font-semibold">Calls by endpoint</h3>
          <ul className="mt-2 space-y-1 text-sm">
            {top.map((e) => (
              <li key={e.endpoint} className="flex justify-between gap-4">
                <span className="font-mono">{e.endpoint}</span>
                <span className="font-mono">{e.calls.toLocaleString('en-US')}</span>
              </li>
            ))}
          </ul>
          <Link to="/usage" className="mt-2 inline-block text-sm text-copper underline underline-offset-2">
            All usage
          </Link>
        </div>
      ) : (
        <p className="mt-4 text-sm text-graphite-soft">No calls counted this month yet.</p>
      )}
    </Panel>
  );
}

function RecentErrors() {
  const errors = useRecentErrors();
  return (
    <Panel title="Recent errors">
      {errors.isPending ? (
        <LoadingState label="Loading recent errors…" />
      ) : errors.isError ? (
        <ErrorState error={errors.error} onRetry={() => void errors.refetch()} />
      ) : errors.data.length === 0 ? (
        <EmptyState title="No errors in the recent calls">Calls answered with a 4xx or 5xx status show here, newest first.</EmptyState>
      ) : (
        <TableScroll label="Recent errors">
          <table className="w-full text-left text-sm">
            <thead>
              <tr className="border-b border-line">
                <th scope="col" className="py-2 pr-4 font-medium">When</th>
                <th scope="col" className="py-2 pr-4 font-medium">Endpoint</th>
                <th scope="col" className="py-2 pr-4 font-medium">Status</th>
                <th scope="col" className="py-2 font-medium">Key</th>
              </tr>
            </thead>
            <tbody>
              {errors.data.map((r) => (
                <tr key={r.id} className="border-b border-line last:border-0">
                  <td className="py-2 pr-4">
                    <Time iso={r.createdAt} />
                  </td>
                  <td className="py-2 pr-4 font-mono">
                    {r.method} {r.endpoint}
                  </td>
                  <td className={`py-2 pr-4 font-mono font-semibold ${r.status >= 500 ? 'text-danger' : 'text-warn'}`}>{r.status}</td>
                  <td className="py-2">{r.keyName ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      )}
    </Panel>
  );
}

function FirstCallSnippet() {
  const { keys, chosen } = useChosenServerKey();
  if (keys.isPending) return <LoadingState label="Loading your keys…" />;
  if (keys.isError) return <ErrorState error={keys.error} onRetry={() => void keys.refetch()} />;
  return (
    <Panel title="Your first call">
      {chosen ? (
        <p className="mb-3 text-sm text-graphite-soft">
          With your server key <span className="font-medium text-graphite">{chosen.name}</span> (<span className="font-mono">{maskedKey(chosen)}</span>, id{' '}
          <span className="font-mono">{chosen.id}</span>): set <span className="font-mono">OHMSTEAD_API_KEY</span> to its secret on your server, then run:
        </p>
      ) : (
        <p className="mb-3 text-sm text-graphite-soft">
          <Link to="/keys" className="font-medium text-copper underline">
            Create a server key
          </Link>
          , set <span className="font-mono">OHMSTEAD_API_KEY</span> to it on your server, then run:
        </p>
      )}
      <CodeTabs
        label="First call as code"
        snippets={buildSnippets({ endpoint: '/v1/packs/energy', body: firstCallBody }, { origin: window.location.origin, key: chosen ? { name: chosen.name, masked: maskedKey(chosen) } : undefined })}
      />
    </Panel>
  );
}

export function OverviewPage() {
  const session = useSession();
  return (
    <div className="space-y-6">
      <PageHeader title="Overview" summary={`${session.data?.organization?.name ?? 'Your organization'}: this month’s calls against your plan, recent errors and your first steps.`} />
      <FirstRun />
      <div className="grid gap-6 xl:grid-cols-2">
        <MonthUsage />
        <RecentErrors />
      </div>
      <FirstCallSnippet />
    </div>
  );
}
