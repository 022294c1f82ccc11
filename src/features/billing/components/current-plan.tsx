import type { BillingOverview } from '#shared/schemas/billing.ts';
import { Panel } from '../../../components/ui/feedback.tsx';
import { formatCount, formatDay } from './format.ts';

const statusWords: Record<string, string> = {
  active: 'Active',
  trialing: 'Trial',
  past_due: 'Payment overdue',
  unpaid: 'Unpaid',
  canceled: 'Canceled',
  incomplete: 'Awaiting first payment',
  incomplete_expired: 'Expired before the first payment',
  paused: 'Paused',
};

/** The plan in force, this month's calls against its quota, and the subscription behind it. */
export function CurrentPlan({ data }: { data: BillingOverview }) {
  const { plan, limits, usage, subscription } = data;
  const usedPct = limits.monthlyQuotaCalls > 0 ? Math.min(100, (usage.usedCalls / limits.monthlyQuotaCalls) * 100) : 100;
  return (
    <Panel title="Current plan">
      <div className="grid gap-6 md:grid-cols-2">
        <div>
          <p className="text-xl font-semibold">{plan.name}</p>
          <p className="text-sm text-graphite-soft">
            <span className="font-mono">${formatCount(plan.priceUsdPerMonth)}</span> a month
          </p>
          {subscription ? (
            <p className="mt-3 text-sm">
              Subscription: <span className="font-medium">{statusWords[subscription.status] ?? subscription.status}</span>
              {subscription.status !== 'canceled' && subscription.currentPeriodEnd ? (
                <>
                  {subscription.cancelAtPeriodEnd ? ', ends on ' : ['past_due', 'unpaid'].includes(subscription.status) ? ', current period ends on ' : ', renews on '}
                  <time dateTime={subscription.currentPeriodEnd} className="font-mono">
                    {formatDay(subscription.currentPeriodEnd)}
                  </time>
                </>
              ) : null}
              {subscription.status === 'canceled' && subscription.canceledAt ? (
                <>
                  {' '}on{' '}
                  <time dateTime={subscription.canceledAt} className="font-mono">
                    {formatDay(subscription.canceledAt)}
                  </time>
                </>
              ) : null}
            </p>
          ) : (
            <p className="mt-3 text-sm text-graphite-soft">No subscription: the free plan needs none.</p>
          )}
          {limits.custom ? <p className="mt-2 text-sm text-graphite-soft">Negotiated limits apply to this organization instead of the plan's.</p> : null}
        </div>
        <div>
          <p id="usage-label" className="text-sm font-medium">
            Calls this month ({usage.month}, UTC)
          </p>
          <div
            role="meter"
            aria-labelledby="usage-label"
            aria-valuemin={0}
            aria-valuemax={limits.monthlyQuotaCalls}
            aria-valuenow={Math.min(usage.usedCalls, limits.monthlyQuotaCalls)}
            aria-valuetext={`${formatCount(usage.usedCalls)} of ${formatCount(limits.monthlyQuotaCalls)} calls`}
            className="mt-2 h-3 w-full overflow-hidden rounded-full bg-paper-deep ring-1 ring-line"
          >
            <div className={`h-full ${usedPct >= 100 ? 'bg-danger' : usedPct >= 80 ? 'bg-warn' : 'bg-copper'}`} style={{ width: `${usedPct}%` }} />
          </div>
          <p className="mt-2 text-sm">
            <span className="font-mono">{formatCount(usage.usedCalls)}</span> of <span className="font-mono">{formatCount(limits.monthlyQuotaCalls)}</span> used ·{' '}
            <span className="font-mono">{formatCount(usage.remainingCalls)}</span> left · resets{' '}
            <time dateTime={usage.resetsAt} className="font-mono">
              {formatDay(usage.resetsAt)}
            </time>
          </p>
          <p className="mt-1 text-sm text-graphite-soft">
            Up to <span className="font-mono">{formatCount(limits.ratePerMinuteCalls)}</span> calls a minute.
          </p>
        </div>
      </div>
    </Panel>
  );
}
