/**
 * The public pricing section (signed-out pages): every plan from shared/plans.ts, the one definition the
 * server enforces. A container query stacks the plans where the space is narrow (the sign-in card) and
 * sets them side by side where it is wide.
 */
import { planIds, plans } from '#shared/plans.ts';
import { formatCount } from './format.ts';
import { PlanLimits } from './plan-limits.tsx';

export function PricingSection() {
  return (
    <section aria-labelledby="pricing-title" className="@container mt-8 border-t border-line pt-6">
      <h2 id="pricing-title" className="text-lg font-semibold tracking-tight">
        Plans
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">Every plan runs every calculation. Start free; an owner upgrades from the console's Billing page.</p>
      <ul className="mt-4 grid gap-3 @2xl:grid-cols-3">
        {planIds.map((id) => {
          const plan = plans[id];
          return (
            <li key={id} className="rounded-lg border border-line bg-paper p-4">
              <div className="flex items-baseline justify-between gap-3">
                <h3 className="font-semibold">{plan.name}</h3>
                <p>
                  <span className="font-mono text-lg font-medium">${formatCount(plan.priceUsdPerMonth)}</span>
                  <span className="text-sm text-graphite-soft"> a month</span>
                </p>
              </div>
              <p className="mt-1 text-sm text-graphite-soft">{plan.summary}</p>
              <div className="mt-3">
                <PlanLimits plan={plan} layout="cells" />
              </div>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
