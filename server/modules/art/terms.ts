import type { EntityManager } from 'typeorm';
import { normaliseKeyword, searchTerms } from '../../../shared/search';

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

export async function addKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = [...new Set(keywords.map(normaliseKeyword).filter(Boolean))];
  if (clean.length === 0) return;
  await manager.query(`INSERT IGNORE INTO art_keywords (art_id, keyword) VALUES ${clean.map(() => '(?, ?)').join(',')}`, clean.flatMap((k) => [artId, k]));
}

export async function removeKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = keywords.map(normaliseKeyword).filter(Boolean);
  if (clean.length === 0) return;
  await manager.query(`DELETE FROM art_keywords WHERE art_id = ? AND keyword IN (${clean.map(() => '?').join(',')})`, [artId, ...clean]);
}

/** Rewrites the search terms of items from their name, keywords and collection name. */
export async function refreshTerms(manager: EntityManager, artIds: string[]) {
  if (artIds.length === 0) return;
  const items: Array<{ id: string; team_id: string; name: string; collection: string | null }> = await manager.query(
    `SELECT a.id, a.team_id, a.name, c.name AS collection FROM art_items a LEFT JOIN collections c ON c.id = a.collection_id
     WHERE a.id IN (${artIds.map(() => '?').join(',')})`,
    artIds,
  );
  const keywords = await keywordsOf(manager, artIds);
  await manager.query(`DELETE FROM art_terms WHERE art_id IN (${artIds.map(() => '?').join(',')})`, artIds);
  const rows: Array<[string, string, string]> = [];
  for (const item of items) {
    const id = String(item.id);
    for (const term of searchTerms(item.name, item.collection ?? '', ...(keywords.get(id) ?? []))) rows.push([String(item.team_id), id, term]);
  }
  for (let i = 0; i < rows.length; i += 500) {
    const batch = rows.slice(i, i + 500);
    await manager.query(`INSERT IGNORE INTO art_terms (team_id, art_id, term) VALUES ${batch.map(() => '(?, ?, ?)').join(',')}`, batch.flat());
  }
}
