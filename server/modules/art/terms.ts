// Keywords and search terms of art. Raw SQL throughout, on purpose: art_keywords and art_terms are
// plain (key, value) index tables with no entity, written as batched INSERT IGNORE and tuple-IN
// deletes in a fixed order (parallel uploads into one team must not deadlock), which the query
// builder cannot express.
import type { EntityManager } from 'typeorm';
import { normaliseKeyword, searchTerms } from '../../../shared/search';
import { vocabularyChanged } from './vocabulary';

/** Keywords of many items at once: art id → sorted keywords. */
export async function keywordsOf(manager: EntityManager, artIds: string[]): Promise<Map<string, string[]>> {
  const map = new Map<string, string[]>(artIds.map((id) => [id, []]));
  if (artIds.length === 0) return map;
  const rows: Array<{ art_id: string; keyword: string }> = await manager.query(
    `SELECT art_id, keyword FROM art_keywords WHERE art_id IN (${artIds.map(() => '?').join(',')}) ORDER BY keyword`,
    artIds,
  );
  for (const row of rows) map.get(String(row.art_id))?.push(row.keyword);
  return map;
}

const sorted = (values: Iterable<string>) => [...values].sort();

export async function addKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = sorted(new Set(keywords.map(normaliseKeyword).filter(Boolean)));
  if (clean.length === 0) return;
  await manager.query(
    `INSERT IGNORE INTO art_keywords (art_id, keyword) VALUES ${clean.map(() => '(?, ?)').join(',')}`,
    clean.flatMap((k) => [artId, k]),
  );
}

export async function removeKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = sorted(new Set(keywords.map(normaliseKeyword).filter(Boolean)));
  if (clean.length === 0) return;
  await manager.query(`DELETE FROM art_keywords WHERE art_id = ? AND keyword IN (${clean.map(() => '?').join(',')})`, [artId, ...clean]);
}

/** Makes an item's keywords exactly `keywords`, touching only the rows that change. */
export async function setKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const want = new Set(keywords.map(normaliseKeyword).filter(Boolean));
  const have = new Set((await keywordsOf(manager, [artId])).get(artId));
  await removeKeywords(
    manager,
    artId,
    [...have].filter((k) => !want.has(k)),
  );
  await addKeywords(
    manager,
    artId,
    [...want].filter((k) => !have.has(k)),
  );
}

/**
 * Rewrites the search terms of items from their name, keywords and collection names, as an ordered
 * diff (only changed rows, items and terms in ascending order): a blanket delete + insert of every
 * term deadlocked parallel uploads into one team.
 */
export async function refreshTerms(manager: EntityManager, artIds: string[]) {
  if (artIds.length === 0) return;
  const ids = [...new Set(artIds)].sort((a, b) => (BigInt(a) < BigInt(b) ? -1 : 1));
  const marks = ids.map(() => '?').join(',');
  const items: Array<{ id: string; team_id: string; name: string; collection: string | null }> = await manager.query(
    `SELECT a.id, a.team_id, a.name, GROUP_CONCAT(c.name ORDER BY c.id SEPARATOR ' ') AS collection FROM art_items a
     LEFT JOIN art_collections m ON m.art_id = a.id LEFT JOIN collections c ON c.id = m.collection_id
     WHERE a.id IN (${marks}) GROUP BY a.id, a.team_id, a.name`,
    ids,
  );
  const keywords = await keywordsOf(manager, ids);
  const current: Array<{ art_id: string; term: string }> = await manager.query(
    `SELECT art_id, term FROM art_terms WHERE art_id IN (${marks})`,
    ids,
  );
  const have = new Map<string, Set<string>>(ids.map((id) => [id, new Set()]));
  for (const row of current) have.get(String(row.art_id))?.add(row.term);
  const gone: Array<[string, string]> = [];
  const added: Array<[string, string, string]> = [];
  for (const item of items) {
    const id = String(item.id);
    const want = new Set(searchTerms(item.name, item.collection ?? '', ...(keywords.get(id) ?? [])));
    const old = have.get(id) ?? new Set<string>();
    for (const term of sorted(old)) if (!want.has(term)) gone.push([id, term]);
    for (const term of sorted(want)) if (!old.has(term)) added.push([String(item.team_id), id, term]);
  }
  if (gone.length || added.length) vocabularyChanged(new Set(items.map((i) => String(i.team_id))));
  for (let i = 0; i < gone.length; i += 500) {
    const batch = gone.slice(i, i + 500);
    await manager.query(`DELETE FROM art_terms WHERE (art_id, term) IN (${batch.map(() => '(?, ?)').join(',')})`, batch.flat());
  }
  for (let i = 0; i < added.length; i += 500) {
    const batch = added.slice(i, i + 500);
    await manager.query(
      `INSERT IGNORE INTO art_terms (team_id, art_id, term) VALUES ${batch.map(() => '(?, ?, ?)').join(',')}`,
      batch.flat(),
    );
  }
}
