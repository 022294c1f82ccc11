/**
 * RateLimit and RateLimit-Policy response headers in the form of draft-ietf-httpapi-ratelimit-headers
 * (the "draft-8" form: Structured Field lists, one item per policy with q/w and r/t parameters), plus
 * Retry-After (RFC 9110 §10.2.3) on a 429. Two policies: the organization's monthly quota (UTC calendar
 * month) and its per-minute rate (fixed one-minute windows).
 */
export interface LimitState {
  monthlyQuotaCalls: number;
  ratePerMinuteCalls: number;
  monthCalls: number;
  windowCalls: number;
  monthStart: Date;
  windowStart: Date;
  now: Date;
}

export function nextMonthStart(monthStart: Date): Date {
  return new Date(Date.UTC(monthStart.getUTCFullYear(), monthStart.getUTCMonth() + 1, 1));
}

const policyCache = new Map<string, string>();

/** The RateLimit-Policy value: the same for every call of an organization in a month, so built once. */
function policyHeader(monthlyQuotaCalls: number, ratePerMinuteCalls: number, monthStart: Date, monthEnd: Date): string {
  const id = `${monthlyQuotaCalls}:${ratePerMinuteCalls}:${monthStart.getTime()}`;
  let value = policyCache.get(id);
  if (value === undefined) {
    const monthWindowS = Math.round((monthEnd.getTime() - monthStart.getTime()) / 1000);
    value = `"monthly";q=${monthlyQuotaCalls};w=${monthWindowS}, "minute";q=${ratePerMinuteCalls};w=60`;
    if (policyCache.size > 10_000) policyCache.clear();
    policyCache.set(id, value);
  }
  return value;
}

export function rateLimitHeaders(s: LimitState): Record<string, string> {
  const monthEnd = nextMonthStart(s.monthStart);
  const monthResetS = Math.max(0, Math.ceil((monthEnd.getTime() - s.now.getTime()) / 1000));
  const minuteResetS = Math.max(0, Math.ceil((s.windowStart.getTime() + 60_000 - s.now.getTime()) / 1000));
  const monthRemaining = Math.max(0, s.monthlyQuotaCalls - s.monthCalls);
  const minuteRemaining = Math.max(0, s.ratePerMinuteCalls - s.windowCalls);
  return {
    'RateLimit-Policy': policyHeader(s.monthlyQuotaCalls, s.ratePerMinuteCalls, s.monthStart, monthEnd),
    RateLimit: `"monthly";r=${monthRemaining};t=${monthResetS}, "minute";r=${minuteRemaining};t=${minuteResetS}`,
  };
}

/** Seconds until the limit that refused a call lets calls through again. */
export function retryAfterSeconds(s: LimitState, refusedBy: 'quota' | 'rate'): number {
  const until = refusedBy === 'quota' ? nextMonthStart(s.monthStart).getTime() : s.windowStart.getTime() + 60_000;
  return Math.max(1, Math.ceil((until - s.now.getTime()) / 1000));
}
