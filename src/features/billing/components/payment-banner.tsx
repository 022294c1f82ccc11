import type { PaymentIssue } from '#shared/schemas/billing.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { formatDay } from './format.ts';

/**
 * The failed-payment banner: while the grace period runs, when it ends and what happens then; after it,
 * that the free plan applies until a payment succeeds. Both lead to the billing portal.
 */
export function PaymentBanner({ issue, planName, onFix, busy }: { issue: PaymentIssue | null; planName: string; onFix: () => void; busy: boolean }) {
  if (!issue) return null;
  const ends = <time dateTime={issue.graceEndsAt} className="font-mono">{formatDay(issue.graceEndsAt)}</time>;
  const failed = <time dateTime={issue.failedAt} className="font-mono">{formatDay(issue.failedAt)}</time>;
  return issue.graceExpired ? (
    <Alert tone="danger" title="Payment failed: the organization is on the free plan">
      <p>
        A payment failed on {failed} and had not been made good by {ends}. Your keys now run with the free plan's limits. Paying the open invoice restores the paid plan
        at once.
      </p>
      <Button className="mt-3" busy={busy} onClick={onFix}>
        Update the card and pay
      </Button>
    </Alert>
  ) : (
    <Alert tone="warn" title="A payment failed">
      <p>
        The payment of {failed} did not go through. Your {planName} plan keeps working until {ends}; if no payment succeeds by then, the organization moves to the free
        plan.
      </p>
      <Button className="mt-3" busy={busy} onClick={onFix}>
        Update the card or retry
      </Button>
    </Alert>
  );
}
