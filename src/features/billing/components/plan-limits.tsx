import type { PlanView } from '#shared/schemas/billing.ts';
import { formatCount } from './format.ts';

/** What a plan allows, as a definition list with the numbers in the mono face. */
export function PlanLimits({ plan }: { plan: Pick<PlanView, 'monthlyQuotaCalls' | 'ratePerMinuteCalls' | 'maxKeys' | 'maxEmbedOrigins'> }) {
  const rows: Array<[string, number]> = [
    ['Calls a month', plan.monthlyQuotaCalls],
    ['Calls a minute', plan.ratePerMinuteCalls],
    ['API keys', plan.maxKeys],
    ['Embed sites', plan.maxEmbedOrigins],
  ];
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1 text-sm">
      {rows.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-graphite-soft">{label}</dt>
          <dd className="text-right font-mono">{formatCount(value)}</dd>
        </div>
      ))}
    </dl>
  );
}
