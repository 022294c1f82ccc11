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

export function rateLimitHeaders(s: LimitState): Record<string, string> {
  const monthEnd = nextMonthStart(s.monthStart);
  const monthWindowS = Math.round((monthEnd.getTime() - s.monthStart.getTime()) / 1000);
  const monthResetS = Math.max(0, Math.ceil((monthEnd.getTime() - s.now.getTime()) / 1000));
  const minuteResetS = Math.max(0, Math.ceil((s.windowStart.getTime() + 60_000 - s.now.getTime()) / 1000));
  const monthRemaining = Math.max(0, s.monthlyQuotaCalls - s.monthCalls);
  const minuteRemaining = Math.max(0, s.ratePerMinuteCalls - s.windowCalls);
  return {
    'RateLimit-Policy': `"monthly";q=${s.monthlyQuotaCalls};w=${monthWindowS}, "minute";q=${s.ratePerMinuteCalls};w=60`,
    RateLimit: `"monthly";r=${monthRemaining};t=${monthResetS}, "minute";r=${minuteRemaining};t=${minuteResetS}`,
  };
}

/** Seconds until the limit that refused a call lets calls through again. */
export function retryAfterSeconds(s: LimitState, refusedBy: 'quota' | 'rate'): number {
  const until = refusedBy === 'quota' ? nextMonthStart(s.monthStart).getTime() : s.windowStart.getTime() + 60_000;
  return Math.max(1, Math.ceil((until - s.now.getTime()) / 1000));
}
