// Forgiving, stemming-free matching for the art library: case and accents ignored, plurals folded
// to a singular form, hyphenated or underscored compounds found by their parts and as one word.

const MAX_TERM = 60;

function fold(text: string): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase();
}

/** English plural → singular by a few spelling rules (no dictionary, no stemming). */
export function singular(word: string): string {
  if (word.length <= 3 || /\d$/.test(word)) return word;
  if (word.endsWith('ies') && word.length > 4) return `${word.slice(0, -3)}y`;
  if (/(s|x|z|ch|sh)es$/.test(word)) return word.slice(0, -2);
  if (word.endsWith('s') && !/(ss|us|is)$/.test(word)) return word.slice(0, -1);
  return word;
}

/** Chunks split at spaces and punctuation; each chunk's parts split at hyphens and underscores. */
function chunks(text: string): string[][] {
  return fold(text)
    .split(/[\s,;/.()[\]{}'"!?&+:|]+/)
    .map((chunk) =>
      chunk
        .split(/[-_]+/)
        .filter((part) => /[a-z0-9]/.test(part))
        .map((part) => part.replace(/[^a-z0-9]/g, '')),
    )
    .filter((parts) => parts.length > 0 && parts.some(Boolean))
    .map((parts) => parts.filter(Boolean));
}

/** Terms stored for an item: every part and every joined compound, singular, unique. */
export function searchTerms(...texts: string[]): string[] {
  const terms = new Set<string>();
  for (const text of texts) {
    for (const parts of chunks(text)) {
      for (const part of parts) terms.add(singular(part).slice(0, MAX_TERM));
      if (parts.length > 1) terms.add(singular(parts.join('')).slice(0, MAX_TERM));
    }
  }
  terms.delete('');
  return [...terms];
}

/**
 * A query as alternatives per chunk: "sun-flower" matches items with both "sun…" and "flower…"
 * terms, or the joined "sunflower…". Every chunk must match (AND).
 */
export function queryChunks(query: string): Array<{ joined: string; parts: string[] }> {
  return chunks(query)
    .slice(0, 8)
    .map((parts) => ({ joined: singular(parts.join('')).slice(0, MAX_TERM), parts: parts.map((p) => singular(p).slice(0, MAX_TERM)) }));
}

/** A keyword as stored: trimmed, lower case, inner spaces collapsed, at most 60 characters. */
export function normaliseKeyword(keyword: string): string {
  return keyword.trim().toLowerCase().replace(/\s+/g, ' ').slice(0, MAX_TERM);
}

/** Keyword suggestions from a file name and its folders: "Spring_Pack/Tulips/red-tulip-02.png". */
export function suggestKeywords(path: string): string[] {
  const segments = path.split('/').filter(Boolean);
  const file = (segments.pop() ?? '').replace(/\.[a-z0-9]+$/i, '');
  const words = [...segments, file]
    .flatMap((segment) => fold(segment).split(/[\s_\-.]+/))
    .map((w) => w.replace(/[^a-z]/g, ''))
    .filter(
      (w) =>
        w.length >= 3 &&
        !['png', 'jpg', 'jpeg', 'webp', 'clipart', 'clip', 'art', 'the', 'and', 'pack', 'set', 'copy', 'final'].includes(w),
    );
  return [...new Set(words.map(singular))].slice(0, 12);
}
