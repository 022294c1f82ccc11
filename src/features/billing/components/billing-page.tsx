/**
 * The Billing page (owners): the plan in force and this month's calls, a banner when a payment failed,
 * the plan cards (upgrade through the hosted checkout, changes and cancellation in the billing portal),
 * and invoices. The plan changes only when the payment provider confirms, so after a checkout the page
 * waits for the confirmation instead of trusting the return.
 */
import { useState } from 'react';
import { useSearchParams } from 'react-router';
import { Button } from '../../../components/ui/button.tsx';
import { Alert, ErrorState, LoadingState, PageHeader } from '../../../components/ui/feedback.tsx';
import { useSession } from '../../../lib/session.ts';
import { hasLiveSubscription, useBilling } from '../api/get-billing.ts';
import { useOpenPortal } from '../api/open-portal.ts';
import { useStartCheckout } from '../api/start-checkout.ts';
import { CurrentPlan } from './current-plan.tsx';
import { InvoiceList } from './invoice-list.tsx';
import { PaymentBanner } from './payment-banner.tsx';
import { PlanCards } from './plan-cards.tsx';

export function BillingPage() {
  const session = useSession();
  if (session.data?.organization?.role !== 'owner') {
    return (
      <div>
        <PageHeader title="Billing" />
        <Alert title="Only the organization's owner manages billing">
          <p>Plans, payment and invoices are the owner's. Your limits this month are on the Usage page.</p>
        </Alert>
      </div>
    );
  }
  return <OwnerBilling />;
}

function OwnerBilling() {
  const [params, setParams] = useSearchParams();
  const returned = params.get('checkout');
  const [pollUntil] = useState(() => (returned === 'success' ? Date.now() + 60_000 : 0));
  const billing = useBilling({ pollUntil });
  const checkout = useStartCheckout();
  const portal = useOpenPortal();
  const data = billing.data;
  const busy = checkout.isPending ? (checkout.variables?.planId ?? null) : portal.isPending ? 'portal' : null;
  const dismiss = () => setParams({}, { replace: true });

  return (
    <div className="space-y-8">
      <PageHeader
        title="Billing"
        summary="Your plan, this month's calls, payment and invoices. Payments are handled by our payment provider; plan changes apply as soon as it confirms them."
        actions={
          data?.canOpenPortal ? (
            <Button tone="secondary" busy={portal.isPending} onClick={() => portal.mutate()}>
              Manage card, plan or cancellation
            </Button>
          ) : null
        }
      />

      {returned === 'success' && data ? (
        hasLiveSubscription(data) ? (
          <Alert tone="ok" title="Subscription confirmed">
            <p>The {data.plan.name} plan applies now, to every key of the organization.</p>
            <Button tone="quiet" className="px-0" onClick={dismiss}>Dismiss</Button>
          </Alert>
        ) : Date.now() < pollUntil ? (
          <Alert title="Waiting for the payment provider's confirmation…">
            <p>The plan changes as soon as the payment is confirmed, usually within seconds.</p>
          </Alert>
        ) : (
          <Alert tone="warn" title="No confirmation yet">
            <p>The payment provider has not confirmed the payment. Reload this page in a minute; nothing is charged twice.</p>
          </Alert>
        )
      ) : null}
      {returned === 'canceled' ? (
        <Alert title="Checkout canceled">
          <p>Nothing was charged and your plan is unchanged.</p>
          <Button tone="quiet" className="px-0" onClick={dismiss}>Dismiss</Button>
        </Alert>
      ) : null}
      {checkout.isError ? <Alert tone="danger" title="The checkout could not be started">{checkout.error.message}</Alert> : null}
      {portal.isError ? <Alert tone="danger" title="The billing portal could not be opened">{portal.error.message}</Alert> : null}

      {billing.isPending ? <LoadingState label="Loading billing…" /> : null}
      {billing.isError ? <ErrorState error={billing.error} onRetry={() => void billing.refetch()} /> : null}
      {data ? (
        <>
          <PaymentBanner issue={data.paymentIssue} planName={data.subscription?.planId ? (data.plans.find((p) => p.id === data.subscription!.planId)?.name ?? data.plan.name) : data.plan.name} onFix={() => portal.mutate()} busy={portal.isPending} />
          <CurrentPlan data={data} />
          <PlanCards data={data} busy={busy} onUpgrade={(planId) => checkout.mutate({ planId })} onManage={() => portal.mutate()} />
          <InvoiceList />
        </>
      ) : null}
    </div>
  );
}
