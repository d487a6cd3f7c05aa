// The library's one search box over names, keywords and collection names, plus filters, sorting
// and paging. Each query chunk matches stored terms (art_terms: team, art, term) by prefix, and,
// forgiving typos, the team's terms within a few edits of it (vocabulary.ts). Best match first:
// per chunk an exact term counts 3, a prefix 2, a near term 1; ties newest first. When a word
// matches no term at all, the nearest one is offered ("did you mean").
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { ArtListQuery, ArtPage } from '../../../shared/schemas/library';
import { queryChunks } from '../../../shared/search';
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
const withTerms = (teamId: string, match: string, values: unknown[]): Sql => ({
  sql: `a.id IN (SELECT t.art_id FROM art_terms t WHERE t.team_id = ? AND ${match})`,
  params: [teamId, ...values],
});
const anyOf = (parts: Sql[]): Sql => ({ sql: `(${parts.map((p) => p.sql).join(' OR ')})`, params: parts.flatMap((p) => p.params) });
const allOf = (parts: Sql[]): Sql => ({ sql: `(${parts.map((p) => p.sql).join(' AND ')})`, params: parts.flatMap((p) => p.params) });

export async function searchArt(
  dataSource: DataSource,
  vocabularies: TeamVocabularies,
  teamId: string,
  query: ArtListQuery,
): Promise<ArtPage> {
  const where: Sql[] = [{ sql: 'a.team_id = ? AND a.deleted_at IS NULL', params: [teamId] }];
  const scores: Sql[] = [];
  const words = queryChunks(query.q);
  const tree = words.length ? await vocabularies.of(teamId) : null;
  let suggested = false;
  const suggestion: string[] = [];
  for (const chunk of words) {
    const prefix = withTerms(teamId, 't.term LIKE ?', [`${chunk.joined}%`]);
    const alternatives = [prefix];
    if (chunk.parts.length > 1) alternatives.push(allOf(chunk.parts.map((p) => withTerms(teamId, 't.term LIKE ?', [`${p}%`]))));
    const near = [...nearTerms(tree!, chunk.joined, editsFor(chunk.joined)).keys()].slice(0, 50);
    if (near.length) alternatives.push(withTerms(teamId, `t.term IN (${near.map(() => '?').join(',')})`, near));
    where.push(anyOf(alternatives));
    const exact = withTerms(teamId, 't.term = ?', [chunk.joined]);
    scores.push({ sql: `(1 + (${exact.sql}) + (${prefix.sql}))`, params: [...exact.params, ...prefix.params] });
    // Did you mean: a word that starts no stored term gets the nearest one, a little further afield than the search.
    const known = tree!.atPrefix(chunk.joined).size > 0 || chunk.parts.every((p) => tree!.atPrefix(p).size > 0);
    const nearest = known ? undefined : [...nearTerms(tree!, chunk.joined, Math.max(2, editsFor(chunk.joined))).keys()][0];
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
  const from = `FROM art_items a LEFT JOIN collections c ON c.id = a.pack_id WHERE ${filter.sql}`;
  const [{ total }] = await dataSource.query(`SELECT COUNT(*) AS total ${from}`, filter.params);
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  const byRelevance = query.sort === 'relevance' && scores.length > 0;
  const score = byRelevance ? { sql: scores.map((s) => s.sql).join(' + '), params: scores.flatMap((s) => s.params) } : null;
  const order = byRelevance
    ? 'score DESC, a.created_at DESC, a.id DESC'
    : query.sort === 'relevance'
      ? 'a.created_at DESC, a.id DESC'
      : `${SORTS[query.sort]} ${dir}, a.id ${dir}`;
  const rows: Array<{ id: string }> = await dataSource.query(
    `SELECT a.id${score ? `, ${score.sql} AS score` : ''} ${from} ORDER BY ${order} LIMIT ? OFFSET ?`,
    [...(score?.params ?? []), ...filter.params, query.pageSize, (query.page - 1) * query.pageSize],
  );
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
