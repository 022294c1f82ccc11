/**
 * The public pricing section (signed-out pages): every plan from shared/plans.ts, the one definition the
 * server enforces. Lays itself out in as many columns as the space allows.
 */
import { planIds, plans } from '#shared/plans.ts';
import { formatCount } from './format.ts';
import { PlanLimits } from './plan-limits.tsx';

export function PricingSection() {
  return (
    <section aria-labelledby="pricing-title" className="mt-8 border-t border-line pt-6">
      <h2 id="pricing-title" className="text-lg font-semibold tracking-tight">
        Plans
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">Every plan runs every calculation. Start free; an owner upgrades from the console's Billing page.</p>
      <ul className="mt-4 grid gap-3 [grid-template-columns:repeat(auto-fit,minmax(11rem,1fr))]">
        {planIds.map((id) => {
          const plan = plans[id];
          return (
            <li key={id} className="rounded-lg border border-line bg-paper p-4">
              <h3 className="font-semibold">{plan.name}</h3>
              <p className="mt-1">
                <span className="font-mono text-xl font-medium">${formatCount(plan.priceUsdPerMonth)}</span>
                <span className="text-sm text-graphite-soft"> a month</span>
              </p>
              <p className="mt-2 text-sm text-graphite-soft">{plan.summary}</p>
              <div className="mt-3">
                <PlanLimits plan={plan} />
              </div>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
