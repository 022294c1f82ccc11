/** Formatting for billing screens: whole numbers with separators, money from cents, calendar dates. */
export const formatCount = (n: number) => n.toLocaleString('en-US');

export const formatMoney = (cents: number, currency = 'usd') =>
  new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase(), minimumFractionDigits: cents % 100 === 0 ? 0 : 2 }).format(cents / 100);

export const formatDay = (iso: string) => new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' });
