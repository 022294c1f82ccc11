import { describe, expect, it } from 'vitest';
import type { ApiKeyView } from '#shared/schemas/keys.ts';
import { firstRunSteps } from './first-run.ts';

const key = (overrides: Partial<ApiKeyView> = {}): ApiKeyView => ({
  id: 'k1',
  name: 'Checkout service',
  kind: 'server',
  displayPrefix: 'ohs_srv_Ab3x',
  last4: 'wxyz',
  allowedOrigins: [],
  createdByUserId: null,
  createdAt: '2026-12-01T10:00:00.000Z',
  lastUsedAt: null,
  expiresAt: null,
  revokedAt: null,
  replacedByKeyId: null,
  status: 'active',
  ...overrides,
});

const done = (steps: ReturnType<typeof firstRunSteps>) => Object.fromEntries(steps.map((s) => [s.id, s.done]));

describe('first-run steps', () => {
  it('when the organization has nothing yet, then no step is ticked', () => {
    expect(done(firstRunSteps([], { used: 0, byKey: [] }))).toEqual({ 'create-key': false, 'first-call': false, 'embed-widget': false });
  });

  it('when a server key exists but has not been used, then only the first step is ticked', () => {
    expect(done(firstRunSteps([key()], { used: 0, byKey: [] }))).toEqual({ 'create-key': true, 'first-call': false, 'embed-widget': false });
  });

  it('when a call was counted this month, or a key was used in an earlier month, then the first call is ticked', () => {
    expect(done(firstRunSteps([key()], { used: 1, byKey: [{ keyId: 'k1', name: 'x', displayPrefix: 'p', calls: 1 }] }))['first-call']).toBe(true);
    expect(done(firstRunSteps([key({ lastUsedAt: '2026-11-03T09:00:00.000Z' })], { used: 0, byKey: [] }))['first-call']).toBe(true);
  });

  it('when an embed key exists (used or not), then the widget step is ticked; a server key alone does not', () => {
    expect(done(firstRunSteps([key({ id: 'e1', kind: 'embed', allowedOrigins: ['https://blog.example'] })], { used: 0, byKey: [] }))['embed-widget']).toBe(true);
    expect(done(firstRunSteps([key()], { used: 5, byKey: [{ keyId: 'k1', name: 'x', displayPrefix: 'p', calls: 5 }] }))['embed-widget']).toBe(false);
  });
});
