/** The billing e-mail: a payment failed, what keeps working until when, and where to fix it. */
import type { OutgoingMail } from '../mail/mailer.ts';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const day = (d: Date) => d.toISOString().slice(0, 10);

export function paymentFailedMail(
  to: string,
  input: { organizationName: string; planName: string; graceEndsAt: Date; billingUrl: string },
): OutgoingMail {
  const subject = `Ohmstead: a payment for ${input.organizationName} failed`;
  const paragraphs = [
    `The latest payment for ${input.organizationName}'s ${input.planName} plan did not go through.`,
    `The plan keeps working until ${day(input.graceEndsAt)} (UTC). If no payment succeeds by then, the organization moves to the free plan and its keys get the free plan's limits; a successful payment restores the plan.`,
    'Update the card or retry the payment from the billing page.',
  ];
  const text = `${paragraphs.join('\n\n')}\n\nBilling: ${input.billingUrl}\n\n— Ohmstead`;
  const html = `<!doctype html><html><body style="font-family:Inter,Arial,sans-serif;color:#2b2a28;background:#faf7f2;padding:24px">
${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
<p><a href="${escapeHtml(input.billingUrl)}" style="color:#a85a23;font-weight:600">Open billing</a></p>
<p style="color:#57534d;font-size:13px">— Ohmstead</p>
</body></html>`;
  return { to, subject, text, html };
}
