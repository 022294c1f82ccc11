import type { PlanView } from '#shared/schemas/billing.ts';
import { formatCount } from './format.ts';

type Limits = Pick<PlanView, 'monthlyQuotaCalls' | 'ratePerMinuteCalls' | 'maxKeys' | 'maxEmbedOrigins'>;

const rows = (plan: Limits): Array<[string, number]> => [
  ['Calls a month', plan.monthlyQuotaCalls],
  ['Calls a minute', plan.ratePerMinuteCalls],
  ['API keys', plan.maxKeys],
  ['Embed sites', plan.maxEmbedOrigins],
];

/**
 * What a plan allows, as a definition list with the numbers in the mono face: one row per limit
 * (`list`), or two columns of number-over-label cells for narrow places (`cells`).
 */
export function PlanLimits({ plan, layout = 'list' }: { plan: Limits; layout?: 'list' | 'cells' }) {
  if (layout === 'cells') {
    return (
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
        {rows(plan).map(([label, value]) => (
          <div key={label} className="flex flex-col-reverse">
            <dt className="text-xs text-graphite-soft">{label}</dt>
            <dd className="font-mono">{formatCount(value)}</dd>
          </div>
        ))}
      </dl>
    );
  }
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1 text-sm">
      {rows(plan).map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-graphite-soft">{label}</dt>
          <dd className="text-right font-mono">{formatCount(value)}</dd>
        </div>
      ))}
    </dl>
  );
}
