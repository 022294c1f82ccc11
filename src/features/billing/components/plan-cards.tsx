import type { BillingOverview, PlanView } from '#shared/schemas/billing.ts';
import { Button } from '../../../components/ui/button.tsx';
import { hasLiveSubscription } from '../api/get-billing.ts';
import { formatCount } from './format.ts';
import { PlanLimits } from './plan-limits.tsx';

interface Actions {
  onUpgrade: (planId: Exclude<PlanView['id'], 'free'>) => void;
  onManage: () => void;
  /** The plan whose checkout is being created, or 'portal'. */
  busy: string | null;
}

/** One card per plan: what it allows and costs, and the way to it from where the organization stands. */
export function PlanCards({ data, ...actions }: { data: BillingOverview } & Actions) {
  return (
    <section aria-labelledby="plans-title">
      <h2 id="plans-title" className="text-lg font-semibold">
        Plans
      </h2>
      <ul className="mt-3 grid gap-4 md:grid-cols-3">
        {data.plans.map((plan) => (
          <li key={plan.id} className={`flex flex-col rounded-lg border bg-white/60 p-5 ${plan.id === data.plan.id ? 'border-copper ring-1 ring-copper' : 'border-line'}`}>
            <h3 className="font-semibold">{plan.name}</h3>
            <p className="mt-1">
              <span className="font-mono text-2xl font-medium">${formatCount(plan.priceUsdPerMonth)}</span>
              <span className="text-sm text-graphite-soft"> a month</span>
            </p>
            <p className="mt-2 text-sm text-graphite-soft">{plan.summary}</p>
            <div className="mt-4">
              <PlanLimits plan={plan} />
            </div>
            <div className="mt-auto pt-5">
              <PlanAction plan={plan} data={data} {...actions} />
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}

function PlanAction({ plan, data, onUpgrade, onManage, busy }: { plan: PlanView; data: BillingOverview } & Actions) {
  const live = hasLiveSubscription(data);
  if (plan.id === data.plan.id) {
    return <p className="text-sm font-medium text-copper">Your current plan</p>;
  }
  if (plan.id === 'free') {
    return live ? (
      <Button tone="secondary" busy={busy === 'portal'} onClick={onManage} aria-label="Cancel the subscription in the billing portal to return to Free">
        Cancel in the portal
      </Button>
    ) : null;
  }
  if (live) {
    return (
      <Button tone="secondary" busy={busy === 'portal'} onClick={onManage} aria-label={`Switch to ${plan.name} in the billing portal`}>
        Switch in the portal
      </Button>
    );
  }
  return (
    <Button busy={busy === plan.id} disabled={busy !== null && busy !== plan.id} onClick={() => onUpgrade(plan.id as Exclude<PlanView['id'], 'free'>)}>
      Upgrade to {plan.name}
    </Button>
  );
}
