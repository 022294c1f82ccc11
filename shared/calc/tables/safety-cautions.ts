/**
 * The safety cautions every wiring, fuse and paralleling answer carries. Wording is Ohmstead's own; the
 * substance is the usual trade caution for DC battery work (common practice, no single published source).
 */

export const BATTERY_WORK_CAUTIONS: readonly string[] = [
  'Work on battery systems can cause burns, fire and electric shock: a short circuit on a battery drives very high DC current, which arcs and heats conductors and tools in seconds.',
  "Follow local electrical codes, the equipment maker's instructions and licensed practice. These figures support planning; they do not replace the equipment's documentation, an inspection or a qualified installer.",
  'Fit a fuse or circuit breaker listed for DC at the system voltage, as close to the battery terminal as practical, on every conductor that leaves the battery.',
  'Never parallel packs of different chemistry or voltage, and bring packs to the same voltage before connecting them to each other.',
];

/** The cautions, as a fresh array for a response. */
export function batteryWorkCautions(...extra: string[]): string[] {
  return [...BATTERY_WORK_CAUTIONS, ...extra];
}
