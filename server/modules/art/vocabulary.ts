// Typo tolerance for the library search: every team's search terms (art_terms) in a radix tree
// (MiniSearch's SearchableMap), from which a query word gets the stored terms within a few edits.
// Levenshtein edits as the tree's fuzzy lookup counts them, plus a swap of two neighbouring
// letters counted as one edit ("gohst" → "ghost"), as in Damerau's measure of spelling errors.
// A team's tree is read once and kept: refreshTerms() in this process marks it stale, and
// another process's changes are picked up after VOCABULARY_TTL_MS; exact and prefix matches never
// depend on the tree (they are SQL), only the typo expansions do.
import SearchableMap from 'minisearch/SearchableMap';
import type { DataSource } from 'typeorm';
import { ArtTerm } from './art-index.entity';

const VOCABULARY_TTL_MS = 30_000;

/**
 * Edits forgiven in a word: none under 4 letters, one up to 7, two from 8. None in a word with a
 * digit: "batch1" and "batch2", "v2" and "v3" are different things, not misspellings.
 */
export const editsFor = (word: string) => (/\d/.test(word) ? 0 : word.length >= 8 ? 2 : word.length >= 4 ? 1 : 0);

/** Words made from `word` by `count` swaps of neighbouring letters, no letter swapped twice. */
function swaps(word: string, count: number, from = 0): string[] {
  if (count === 0) return [word];
  const out: string[] = [];
  for (let i = from; i + 1 < word.length; i++) {
    if (word[i] === word[i + 1]) continue;
    const swapped = word.slice(0, i) + word[i + 1] + word[i] + word.slice(i + 2);
    out.push(...swaps(swapped, count - 1, i + 2));
  }
  return out;
}

/**
 * Stored terms within `edits` of `word`, each with its distance (nearest first): the tree's
 * Levenshtein lookup from the word itself and from each way of swapping up to `edits` pairs of
 * neighbouring letters, a swap counted as one edit (the optimal string alignment distance).
 */
export function nearTerms(tree: SearchableMap<true>, word: string, edits: number): Map<string, number> {
  const found = new Map<string, number>();
  if (edits <= 0) return found;
  for (let swapped = 0; swapped <= edits; swapped++) {
    for (const variant of swaps(word, swapped)) {
      for (const [term, [, distance]] of tree.fuzzyGet(variant, edits - swapped)) {
        if (distance + swapped < (found.get(term) ?? Infinity)) found.set(term, distance + swapped);
      }
    }
  }
  return new Map([...found].sort((a, b) => a[1] - b[1] || a[0].localeCompare(b[0])));
}

const generations = new Map<string, number>();
/** Marks teams' trees stale in this process (called when their terms change). */
export function vocabularyChanged(teamIds: Iterable<string>) {
  for (const id of teamIds) generations.set(id, (generations.get(id) ?? 0) + 1);
}

/** The teams' trees, read on first use and again once stale or older than the TTL. */
export class TeamVocabularies {
  private readonly trees = new Map<string, { tree: SearchableMap<true>; generation: number; at: number }>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly ttlMs = VOCABULARY_TTL_MS,
  ) {}

  async of(teamId: string): Promise<SearchableMap<true>> {
    const generation = generations.get(teamId) ?? 0;
    const kept = this.trees.get(teamId);
    if (kept && kept.generation === generation && Date.now() - kept.at < this.ttlMs) return kept.tree;
    // The (team_id, term) index answers this DISTINCT without reading the rows.
    const rows: Array<{ term: string }> = await this.dataSource
      .getRepository(ArtTerm)
      .createQueryBuilder('t')
      .select('DISTINCT t.term', 'term')
      .where('t.team_id = :teamId', { teamId })
      .getRawMany();
    const tree = new SearchableMap<true>();
    for (const { term } of rows) tree.set(term, true);
    this.trees.set(teamId, { tree, generation, at: Date.now() });
    return tree;
  }
}
