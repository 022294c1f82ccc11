/** Numbers as the console shows them: grouped, with a sensible number of significant digits. */
export function formatNumber(value: number | null | undefined, options: { maxDecimals?: number; significant?: number } = {}): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const abs = Math.abs(value);
  const significant = options.significant ?? 4;
  // Enough decimals for `significant` digits, at most maxDecimals (default 3).
  const decimals = abs === 0 ? 0 : Math.min(options.maxDecimals ?? 3, Math.max(0, significant - 1 - Math.floor(Math.log10(abs))));
  return value.toLocaleString('en-US', { maximumFractionDigits: decimals, minimumFractionDigits: 0 });
}

export function formatDuration(hours: number | null | undefined): string {
  if (hours === null || hours === undefined || !Number.isFinite(hours)) return '—';
  const totalMinutes = Math.round(hours * 60);
  const h = Math.floor(totalMinutes / 60);
  const m = totalMinutes % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}
