// Money on orders is kept in integer minor units (cents): prices are entered in major units with at
// most two decimals, turned into cents once, and every sum, share and balance after that is integer
// arithmetic, so a total never drifts by a cent however it is split.

/** Currencies we take payments in: all have two decimals (ISO 4217 minor unit 2). */
export const ORDER_CURRENCIES = ['USD', 'EUR', 'GBP', 'CAD', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK'] as const;
export type OrderCurrency = (typeof ORDER_CURRENCIES)[number];

const SIGNS: Record<OrderCurrency, string> = {
  USD: '$',
  EUR: '€',
  GBP: '£',
  CAD: 'CA$',
  AUD: 'A$',
  NZD: 'NZ$',
  CHF: 'CHF ',
  SEK: 'SEK ',
  NOK: 'NOK ',
  DKK: 'DKK ',
};

/**
 * Cents from a price typed in major units, or null when it is not a whole number of cents
 * (0.001, 1.234) or not a finite non-negative number. Decided on the decimal text, not on floating
 * point: 0.1 + 0.2 style errors never reach a price.
 */
export function toMinor(value: number | string): number | null {
  const text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : value.trim();
  const m = /^(\d{1,9})(?:\.(\d{1,2}))?$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'));
}

/** Cents as major units text: 7729 → "77.29". */
export function minorText(minor: number): string {
  const sign = minor < 0 ? '-' : '';
  const abs = Math.abs(minor);
  return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`;
}

export const formatMinor = (minor: number, currency: OrderCurrency) => `${SIGNS[currency]}${minorText(minor)}`;

/** A share of a total in cents, rounded half up: 50 % of 7729 is 3865 (the balance then 3864). */
export function shareOf(totalMinor: number, percent: number): number {
  if (!Number.isInteger(totalMinor) || !Number.isInteger(percent)) throw new Error('shareOf takes whole cents and whole percents');
  return Math.floor((totalMinor * percent + 50) / 100);
}

type PricedLine = { unitPriceMinor: number; quantity: number };

/** The order's total: each line's unit price times its quantity, summed, all in cents. */
export const orderTotal = (lines: PricedLine[]) => lines.reduce((sum, l) => sum + l.unitPriceMinor * l.quantity, 0);

/**
 * What the buyer owes now: the deposit while nothing is paid and a deposit is asked, else the
 * balance (the total less what was paid, refunds not counted back in).
 */
export function amountDue(totalMinor: number, paidMinor: number, depositPercent: number): { kind: 'deposit' | 'balance'; minor: number } {
  const deposit = shareOf(totalMinor, depositPercent);
  // A deposit that rounds to nothing is no deposit: the whole is due.
  if (paidMinor === 0 && depositPercent > 0 && depositPercent < 100 && deposit > 0) return { kind: 'deposit', minor: deposit };
  return { kind: 'balance', minor: Math.max(0, totalMinor - paidMinor) };
}
