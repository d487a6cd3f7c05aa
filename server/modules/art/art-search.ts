// The library's one search box over names, keywords and collection names, plus filters, sorting
// and paging. Each query chunk matches stored terms (art_terms: team, art, term) by prefix, and,
// forgiving typos, the team's terms within a few edits of it (vocabulary.ts). Best match first:
// per chunk an exact term counts 3, a prefix 2, a near term 1; ties newest first. When a word
// matches no term at all, the nearest one is offered ("did you mean"). Raw SQL on purpose: one
// derived table per word (a UNION ALL of grouped reads of art_terms) joined to the items, which the
// query builder cannot express.
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { ArtListQuery, ArtPage } from '@shared/schemas/library';
import { queryChunks } from '@shared/search';
import { ArtItem } from './art-item.entity';
import { artViews } from './art-view';
import type { TeamVocabularies } from './vocabulary';
import { editsFor, nearTerms } from './vocabulary';

const SORTS: Record<Exclude<ArtListQuery['sort'], 'relevance'>, string> = {
  created: 'a.created_at',
  name: 'a.name',
  size: 'a.size_bytes',
  pixels: '(a.width_px * a.height_px)',
};

type Sql = { sql: string; params: unknown[] };
const allOf = (parts: Sql[]): Sql => ({ sql: `(${parts.map((p) => p.sql).join(' AND ')})`, params: parts.flatMap((p) => p.params) });
const marks = (n: number) => Array.from({ length: n }, () => '?').join(',');

/**
 * The items one query chunk matches, each with its score: 3 for an exact term, 2 for a prefix, 1
 * for a near term (or for a hyphenated chunk's parts all found as separate terms). One grouped read
 * of the (team, term) index per chunk, joined to the items: the cost follows the matches, not the
 * size of the library.
 */
function chunkMatches(teamId: string, joined: string, parts: string[], near: string[]): Sql {
  const terms: Sql = {
    sql: `SELECT t.art_id, CASE WHEN t.term = ? THEN 3 WHEN t.term LIKE ? THEN 2 ELSE 1 END AS score FROM art_terms t
          WHERE t.team_id = ? AND (t.term LIKE ?${near.length ? ` OR t.term IN (${marks(near.length)})` : ''})`,
    params: [joined, `${joined}%`, teamId, `${joined}%`, ...near],
  };
  if (parts.length < 2) return { sql: `SELECT art_id, MAX(score) AS score FROM (${terms.sql}) m GROUP BY art_id`, params: terms.params };
  const which = parts.map((_, k) => `WHEN t.term LIKE ? THEN ${k}`).join(' ');
  const split: Sql = {
    sql: `SELECT t.art_id, 1 AS score FROM art_terms t WHERE t.team_id = ? AND (${parts.map(() => 't.term LIKE ?').join(' OR ')})
          GROUP BY t.art_id HAVING COUNT(DISTINCT CASE ${which} END) = ${parts.length}`,
    params: [teamId, ...parts.map((p) => `${p}%`), ...parts.map((p) => `${p}%`)],
  };
  return {
    sql: `SELECT art_id, MAX(score) AS score FROM (${terms.sql} UNION ALL ${split.sql}) m GROUP BY art_id`,
    params: [...terms.params, ...split.params],
  };
}

export async function searchArt(
  dataSource: DataSource,
  vocabularies: TeamVocabularies,
  teamId: string,
  query: ArtListQuery,
  /** Off only in the benchmark, which measures the plain prefix search beside the forgiving one. */
  forgiving = true,
): Promise<ArtPage> {
  const where: Sql[] = [{ sql: 'a.team_id = ? AND a.deleted_at IS NULL', params: [teamId] }];
  const joins: Sql[] = [];
  const words = queryChunks(query.q);
  const tree = words.length && forgiving ? await vocabularies.of(teamId) : null;
  let suggested = false;
  const suggestion: string[] = [];
  for (const [k, chunk] of words.entries()) {
    const near = tree
      ? [...nearTerms(tree, chunk.joined, editsFor(chunk.joined)).keys()].filter((t) => !t.startsWith(chunk.joined)).slice(0, 50)
      : [];
    const matches = chunkMatches(teamId, chunk.joined, chunk.parts, near);
    joins.push({ sql: `JOIN (${matches.sql}) s${k} ON s${k}.art_id = a.id`, params: matches.params });
    if (!tree) continue;
    // Did you mean: a word that starts no stored term gets the nearest one, a little further afield than the search.
    const known = tree!.atPrefix(chunk.joined).size > 0 || chunk.parts.every((p) => tree!.atPrefix(p).size > 0);
    const reach = /\d/.test(chunk.joined) ? 0 : Math.max(2, editsFor(chunk.joined));
    const nearest = known ? undefined : [...nearTerms(tree, chunk.joined, reach).keys()][0];
    suggestion.push(nearest ?? chunk.joined);
    if (nearest) suggested = true;
  }
  if (query.collectionId === 'none') where.push({ sql: 'NOT EXISTS (SELECT 1 FROM art_collections m WHERE m.art_id = a.id)', params: [] });
  else if (query.collectionId)
    where.push({
      sql: 'EXISTS (SELECT 1 FROM art_collections m WHERE m.art_id = a.id AND m.collection_id = ?)',
      params: [query.collectionId],
    });
  if (query.licence === 'none') where.push({ sql: 'COALESCE(a.licence_kind, c.licence_kind) IS NULL', params: [] });
  else if (query.licence) where.push({ sql: 'COALESCE(a.licence_kind, c.licence_kind) = ?', params: [query.licence] });
  if (query.transparency) where.push({ sql: 'a.has_transparency = ?', params: [query.transparency === 'yes' ? 1 : 0] });
  if (query.uploadedBy) where.push({ sql: 'a.uploaded_by = ?', params: [query.uploadedBy] });
  if (query.from) where.push({ sql: 'a.created_at >= ?', params: [`${query.from} 00:00:00`] });
  if (query.to) where.push({ sql: 'a.created_at < DATE_ADD(?, INTERVAL 1 DAY)', params: [query.to] });

  const filter = allOf(where);
  const joined = { sql: joins.map((j) => j.sql).join(' '), params: joins.flatMap((j) => j.params) };
  const from = `FROM art_items a ${joined.sql} LEFT JOIN collections c ON c.id = a.pack_id WHERE ${filter.sql}`;
  const params = [...joined.params, ...filter.params];
  // Raw SQL on purpose: one grouped subquery per query word, joined and scored, with optional filters;
  // built here from parameterised parts (never from the maker's text), which the query builder cannot nest.
  const [{ total }] = await dataSource.query(`SELECT COUNT(*) AS total ${from}`, params);
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  const score = words.map((_, k) => `s${k}.score`).join(' + ');
  const order =
    query.sort !== 'relevance'
      ? `${SORTS[query.sort]} ${dir}, a.id ${dir}`
      : words.length
        ? `${score} DESC, a.created_at DESC, a.id DESC`
        : 'a.created_at DESC, a.id DESC';
  const rows: Array<{ id: string }> = await dataSource.query(`SELECT a.id ${from} ORDER BY ${order} LIMIT ? OFFSET ?`, [
    ...params,
    query.pageSize,
    (query.page - 1) * query.pageSize,
  ]);
  const ids = rows.map((r) => String(r.id));
  const items = ids.length ? await dataSource.getRepository(ArtItem).findBy({ id: In(ids) }) : [];
  const byId = new Map(items.map((i) => [i.id, i]));
  const ordered = ids.map((id) => byId.get(id)!).filter(Boolean);
  return {
    items: await artViews(dataSource.manager, ordered),
    total: Number(total),
    page: query.page,
    pageSize: query.pageSize,
    suggestion: suggested ? suggestion.join(' ') : null,
  };
}
