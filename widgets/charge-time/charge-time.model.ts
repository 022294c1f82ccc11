/** The charge-time estimator's request and its chart's points (pure). */
import type { z } from 'zod';
import type { ChargeTimeData, ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';

export type ChargeTimeRequest = z.input<typeof ChargeTimeInputSchema>;

/**
 * The state-of-charge curve as an SVG polyline in a width × height box: time to the right, state of charge
 * up (0–100 %).
 */
export function profilePoints(profile: ChargeTimeData['profile'], width: number, height: number): string {
  const last = profile[profile.length - 1]?.minute ?? 0;
  if (profile.length < 2 || last <= 0) return '';
  return profile.map((p) => `${((p.minute / last) * width).toFixed(1)},${(height - (p.socPct / 100) * height).toFixed(1)}`).join(' ');
}

export const limitedByText = { source: 'the charger', pack_limit: 'the pack\'s charge limit' } as const;
