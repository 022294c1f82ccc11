/** Deleting an organization: the typed-name confirmation, and never while a subscription would still be charged. */
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { billingSubscriptions, organizations } from '../../db/schema/index.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';

let kit: ConsoleKit;
beforeAll(async () => {
  kit = await startConsoleKit();
});
afterAll(() => kit.close());

const del = (cookie: string, confirmName: string) =>
  request(kit.app).delete('/console-api/organization').set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ confirmName });

describe('deleting an organization', () => {
  it('when the typed name does not match, then it is a 422 and nothing is deleted', async () => {
    const { org, members } = await createOrganizationWith(kit.db, 'del-typo', ['owner']);
    const res = await del(await sessionCookie(kit.db, members.owner!.id, org.id), 'not the name');
    expect(res.status).toBe(422);
    expect(await kit.db.select().from(organizations).where(eq(organizations.id, org.id))).toHaveLength(1);
  });

  it('when a paid subscription is live, then it is a 409 pointing to billing, and the organization stays', async () => {
    const { org, members } = await createOrganizationWith(kit.db, 'del-paying', ['owner']);
    await kit.db.insert(billingSubscriptions).values({
      stripeSubscriptionId: `sub_test_${org.id.slice(0, 8)}`,
      organizationId: org.id,
      stripeCustomerId: 'cus_test',
      status: 'active',
      stripePriceId: 'price_builder',
      planId: 'builder',
      lastEventCreatedAt: new Date(),
      syncedAt: new Date(),
    });
    const cookie = await sessionCookie(kit.db, members.owner!.id, org.id);
    const res = await del(cookie, org.name);
    expect(res.status).toBe(409);
    expect(res.body.reason).toBe('subscription_active');
    expect(await kit.db.select().from(organizations).where(eq(organizations.id, org.id))).toHaveLength(1);

    await kit.db.update(billingSubscriptions).set({ status: 'canceled' }).where(eq(billingSubscriptions.organizationId, org.id));
    expect((await del(cookie, org.name)).status).toBeLessThan(300);
    expect(await kit.db.select().from(organizations).where(eq(organizations.id, org.id))).toHaveLength(0);
  });
});
