// The typo lookup against a reference: the optimal string alignment distance (Levenshtein plus a
// swap of neighbouring letters, as Damerau counted spelling errors) computed by the
// `damerau-levenshtein` package from npm (test-only), over random words from a small alphabet so
// that many terms lie near each other.
import damerauLevenshtein from 'damerau-levenshtein';
import SearchableMap from 'minisearch/SearchableMap';
import { describe, expect, it } from 'vitest';
import { editsFor, nearTerms } from './vocabulary';

function random(seed: number) {
  return () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
}

describe('near terms', () => {
  it('finds exactly the terms within the allowed edits, with their distances (reference: damerau-levenshtein)', () => {
    const rnd = random(42);
    const letters = 'abcde';
    const word = (n: number) => Array.from({ length: n }, () => letters[Math.floor(rnd() * letters.length)]).join('');
    const terms = [...new Set(Array.from({ length: 400 }, () => word(3 + Math.floor(rnd() * 7))))];
    const tree = new SearchableMap<true>();
    for (const t of terms) tree.set(t, true);
    let compared = 0;
    // Half the queries are terms with one to three slips (a swap, a letter dropped, added or wrong), half are random.
    const slip = (w: string) => {
      const i = Math.floor(rnd() * w.length);
      const kind = Math.floor(rnd() * 4);
      if (kind === 0 && i + 1 < w.length) return w.slice(0, i) + w[i + 1] + w[i] + w.slice(i + 2);
      if (kind === 1 && w.length > 3) return w.slice(0, i) + w.slice(i + 1);
      if (kind === 2) return w.slice(0, i) + word(1) + w.slice(i);
      return w.slice(0, i) + word(1) + w.slice(i + 1);
    };
    for (let q = 0; q < 400; q++) {
      let query = q % 2 ? word(3 + Math.floor(rnd() * 8)) : terms[Math.floor(rnd() * terms.length)];
      if (q % 2 === 0) for (let k = 1 + Math.floor(rnd() * 3); k > 0; k--) query = slip(query);
      const edits = editsFor(query);
      const expected = new Map(
        terms.map((t) => [t, damerauLevenshtein(query, t).steps] as const).filter(([, d]) => d <= edits && edits > 0),
      );
      const found = nearTerms(tree, query, edits);
      expect(new Map([...found].sort()), query).toEqual(new Map([...expected].sort()));
      compared += expected.size;
    }
    expect(compared).toBeGreaterThan(300); // the check saw many near terms, not a run of empty sets
  });

  it('forgives one edit in words of 4 to 7 letters, two from 8, none below 4 or in words with a digit', () => {
    expect([3, 4, 7, 8, 12].map((n) => editsFor('x'.repeat(n)))).toEqual([0, 1, 1, 2, 2]);
    expect(editsFor('batch1')).toBe(0); // numbered names are not misspelt: batch1 is not batch2
    expect(editsFor('halloween2026')).toBe(0);
  });
});
