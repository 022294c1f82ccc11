/**
 * Overcurrent-protection tables.
 *
 * - NFPA 70 National Electrical Code, **2023 edition**, 240.6(A) standard ampere ratings for fuses and
 *   inverse-time breakers: 15 … 6000 A (published, grade A). The same clause lists additional standard
 *   ratings for fuses of 1, 3, 6, 10 and 601 A; those five are from memory (grade C) and are included
 *   because the devices sized here are fuses.
 * - NEC 2023 240.4(D) small-conductor limits: see `smallConductorMaxOcpdA` on the conductor rows.
 * - UL 248 (low-voltage fuses) preferred DC interrupting ratings 10, 20, 50, 100, 150, 200 and 300 kA
 *   (fuse maker's guide quoting UL 248-2/-12; secondary, grade B). Used only to suggest a rating class.
 */

/** NEC 2023 240.6(A) standard ratings, A. */
export const nec240_6StandardRatingsA: readonly number[] = [
  15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400, 450, 500, 600, 700, 800,
  1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
];

/** NEC 240.6(A) additional standard ratings for fuses, A (from memory, grade C). */
export const nec240_6AdditionalFuseRatingsA: readonly number[] = [1, 3, 6, 10, 601];

/** Every standard fuse rating, ascending. */
export const standardFuseRatingsA: readonly number[] = [...nec240_6StandardRatingsA, ...nec240_6AdditionalFuseRatingsA].sort((a, b) => a - b);

/** Tolerance for comparing currents that come out of a multiplication (1.25 × 16 = 20.000000000000004). */
const EPS_A = 1e-9;

/** Smallest standard fuse rating at or above a current, A; undefined above 6000 A. */
export function smallestStandardRatingAtLeast(currentA: number): number | undefined {
  return standardFuseRatingsA.find((r) => r >= currentA - EPS_A);
}

/** Largest standard fuse rating at or below a current, A; undefined below 1 A. */
export function largestStandardRatingAtMost(currentA: number): number | undefined {
  let best: number | undefined;
  for (const r of standardFuseRatingsA) if (r <= currentA + EPS_A) best = r;
  return best;
}

/** UL 248 preferred DC interrupting ratings, A (grade B). */
export const ul248PreferredDcInterruptRatingsA: readonly number[] = [10_000, 20_000, 50_000, 100_000, 150_000, 200_000, 300_000];

/** Lowest preferred interrupting rating at or above a prospective short-circuit current; undefined above 300 kA. */
export function preferredInterruptRatingAtLeast(currentA: number): number | undefined {
  return ul248PreferredDcInterruptRatingsA.find((r) => r >= currentA - EPS_A);
}

export const overcurrentSources: readonly string[] = [
  'NFPA 70 National Electrical Code, 2023 edition, 240.6(A): standard ampere ratings (additional fuse ratings 1, 3, 6, 10 and 601 A from memory)',
  'NFPA 70 National Electrical Code, 2023 edition, 240.4(D): small-conductor overcurrent-protection limits',
];

export const interruptRatingSources: readonly string[] = ['UL 248 preferred DC interrupting ratings 10/20/50/100/150/200/300 kA (as quoted in a fuse maker\'s guide; secondary source)'];
