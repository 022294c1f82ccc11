/**
 * Quota e-mails: when an organization's calls this month reach 80 % and then 100 % of its quota, its
 * owners and admins get one e-mail each time, once per month and threshold across every instance (a row
 * in quota_notifications is the claim). A per-instance memory of thresholds already handled keeps this off
 * the hot path: after the first crossing, a call costs one set lookup.
 */
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { memberships, organizations, quotaNotifications, users } from '../../db/schema/index.ts';
import type { Logger } from '../../logger.ts';
import type { Mailer } from '../mail/mailer.ts';
import type { MeteringHooks } from '../metering/metering.ts';

export const QUOTA_THRESHOLDS_PCT = [80, 100] as const;

export function quotaEmail(input: { organizationName: string; thresholdPct: number; used: number; quota: number; month: string; consoleUrl: string }) {
  const reached = input.thresholdPct >= 100;
  const subject = reached
    ? `Ohmstead: ${input.organizationName} has used this month's ${input.quota.toLocaleString('en-US')} calls`
    : `Ohmstead: ${input.organizationName} has used ${input.thresholdPct}% of this month's calls`;
  const next = reached
    ? 'Further calculation calls are refused with HTTP 429 until the quota resets at the start of the next UTC month, or until the plan is raised.'
    : 'Calls keep working until the quota is used up; then they are refused with HTTP 429 until the next UTC month.';
  const text = `${input.used.toLocaleString('en-US')} of ${input.quota.toLocaleString('en-US')} calls used in ${input.month} (UTC).\n\n${next}\n\nUsage and plans: ${input.consoleUrl}/usage\n`;
  const html = `<p>${input.used.toLocaleString('en-US')} of ${input.quota.toLocaleString('en-US')} calls used in ${input.month} (UTC).</p><p>${next}</p><p><a href="${input.consoleUrl}/usage">Usage and plans</a></p>`;
  return { subject, text, html };
}

export function createQuotaNotifier(deps: { db: Db; mailer: Mailer; logger: Logger; consoleUrl: string }): Required<MeteringHooks>['onCounted'] {
  const handled = new Set<string>();
  const claim = async (organizationId: string, month: string, thresholdPct: number, used: number, quota: number) => {
    const inserted = await deps.db
      .insert(quotaNotifications)
      .values({ organizationId, month, thresholdPct, details: { used, quota } })
      .onConflictDoNothing()
      .returning({ organizationId: quotaNotifications.organizationId });
    if (inserted.length === 0) return;
    const [org] = await deps.db.select({ name: organizations.name }).from(organizations).where(eq(organizations.id, organizationId));
    const recipients = await deps.db
      .select({ email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.organizationId, organizationId), inArray(memberships.role, ['owner', 'admin'])));
    const mail = quotaEmail({ organizationName: org?.name ?? 'Your organization', thresholdPct, used, quota, month: month.slice(0, 7), consoleUrl: deps.consoleUrl });
    for (const { email } of recipients) await deps.mailer.send({ to: email, ...mail });
  };
  return (organizationId, monthCalls, monthlyQuotaCalls, monthStart) => {
    // Below the first threshold (nearly every call) nothing is built.
    if (monthCalls * 100 < QUOTA_THRESHOLDS_PCT[0] * monthlyQuotaCalls) return;
    const month = monthStart.toISOString().slice(0, 10);
    for (const thresholdPct of QUOTA_THRESHOLDS_PCT) {
      if (monthCalls * 100 < thresholdPct * monthlyQuotaCalls) continue;
      const id = `${organizationId}:${month}:${thresholdPct}`;
      if (handled.has(id)) continue;
      handled.add(id);
      claim(organizationId, month, thresholdPct, monthCalls, monthlyQuotaCalls).catch((err: unknown) => {
        handled.delete(id);
        deps.logger.warn({ err, organizationId, thresholdPct }, 'quota e-mail failed');
      });
    }
  };
}
