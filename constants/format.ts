const dateFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-US', {
  month: 'short',
  day: 'numeric',
  year: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
});
const wholeNumber = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

export const formatDate = (iso: string) => dateFormat.format(new Date(iso));
export const formatDateTime = (iso: string) => dateTimeFormat.format(new Date(iso));
export const formatMiles = (miles: number | null) => (miles == null ? 'Odometer not recorded' : `${wholeNumber.format(miles)} mi`);

const moneyFormats = new Map<string, Intl.NumberFormat>();

/** Whole cents as money, e.g. 48500 → "$485.00"; US dollars unless another ISO currency code is given. */
export function formatCents(cents: number, currency = 'usd'): string {
  const code = currency.toUpperCase();
  let format = moneyFormats.get(code);
  if (!format) moneyFormats.set(code, (format = new Intl.NumberFormat('en-US', { style: 'currency', currency: code })));
  return format.format(cents / 100);
}

/** A grinder's quote in one sentence, the same on the order, the sheet's order list and the mail: "Quote $485.00, ready in 8 days". */
export function quoteSentence(quote: { priceCents: number; leadTimeDays: number }): string {
  return `Quote ${formatCents(quote.priceCents)}, ready in ${quote.leadTimeDays} ${quote.leadTimeDays === 1 ? 'day' : 'days'}`;
}

/** How long ago, in plain words: "just now", "5 minutes", "3 hours", "2 days". */
export function formatAge(iso: string, now: number = Date.now()): string {
  const minutes = Math.max(0, Math.floor((now - new Date(iso).getTime()) / 60_000));
  if (minutes < 1) return 'just now';
  const plural = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
  if (minutes < 60) return plural(minutes, 'minute');
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return plural(hours, 'hour');
  return plural(Math.floor(hours / 24), 'day');
}
