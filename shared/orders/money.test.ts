import { describe, expect, it } from 'vitest';
import { amountDue, minorText, orderTotal, shareOf, toMinor } from './money';
import { gridCount } from './pricing';

// Independent of money.ts: cents read from the decimal text with BigInt, no floating point at all.
const bigCents = (text: string) => {
  const [whole, frac = ''] = text.split('.');
  return BigInt(whole) * 100n + BigInt(frac.padEnd(2, '0'));
};

describe('money in whole cents', () => {
  it('reads prices with at most two decimals and refuses anything finer or negative', () => {
    expect(toMinor('5.93')).toBe(593);
    expect(toMinor(0.1)).toBe(10);
    expect(toMinor('0.07')).toBe(7);
    expect(toMinor(12)).toBe(1200);
    for (const bad of ['0.001', 1.234, '-1', '', 'abc', '1e3', Number.NaN, Infinity, '1.2.3']) expect(toMinor(bad as string)).toBeNull();
    // Random prices from 0.00 to 99999.99: the same cents as BigInt arithmetic on the text.
    for (let i = 0; i < 2000; i++) {
      const text = `${Math.floor(Math.random() * 100000)}.${String(Math.floor(Math.random() * 100)).padStart(2, '0')}`;
      expect(BigInt(toMinor(text)!)).toBe(bigCents(text));
      expect(minorText(toMinor(text)!)).toBe(text.replace(/^0+(?=\d)/, ''));
    }
  });

  it('splits a total into deposit and balance that add up to the cent (README worked example)', () => {
    // 50 stickers at 0.09 and 3 sheets at 5.93: 450 + 1779 = 2229 cents.
    const total = orderTotal([
      { unitPriceMinor: 9, quantity: 50 },
      { unitPriceMinor: 593, quantity: 3 },
    ]);
    expect(total).toBe(2229);
    expect(shareOf(total, 50)).toBe(1115); // 1114.5 rounds half up
    expect(amountDue(total, 0, 50)).toEqual({ kind: 'deposit', minor: 1115 });
    expect(amountDue(total, 1115, 50)).toEqual({ kind: 'balance', minor: 1114 });
    expect(amountDue(total, 0, 0)).toEqual({ kind: 'balance', minor: 2229 });
    // Every split of every total from 1 to 5000 cents at every whole percent adds back up exactly.
    for (let t = 1; t <= 5000; t += 7)
      for (let p = 1; p < 100; p++) {
        const first = amountDue(t, 0, p);
        expect(first.kind).toBe(shareOf(t, p) > 0 ? 'deposit' : 'balance');
        const deposit = first.kind === 'deposit' ? first.minor : 0;
        expect(deposit + amountDue(t, deposit, p).minor).toBe(t);
        expect(Math.abs(deposit - (t * p) / 100)).toBeLessThanOrEqual(0.5);
      }
  });

  it('counts a grid of stickers on the print area (hand arithmetic)', () => {
    // 171.45 × 234.95 mm, 3.175 mm margin and gap, 76.2 mm squares: 2 × 2.
    expect(gridCount({ width: 171.45, height: 234.95 }, 3.175, 3.175, { width: 76.2, height: 76.2 })).toBe(4);
    // 2 in × 1 in labels: 3 across and 8 down upright, or 6 across and 2 down turned: 24 either way is 3 × 8.
    expect(gridCount({ width: 171.45, height: 234.95 }, 3.175, 3.175, { width: 50.8, height: 25.4 })).toBe(24);
    expect(gridCount({ width: 100, height: 100 }, 0, 0, { width: 120, height: 10 })).toBe(0);
  });
});
