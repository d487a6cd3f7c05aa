import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { ArtListQuery, ArtView } from '../../../shared/schemas/library';
import { queryChunks } from '../../../shared/search';
import { ArtItem } from './art-item.entity';
import { artViews } from './art-view';

const SORTS: Record<ArtListQuery['sort'], string> = {
  created: 'a.created_at',
  name: 'a.name',
  size: 'a.size_bytes',
  pixels: '(a.width_px * a.height_px)',
};

/**
 * One search box over names, keywords and collection names, plus filters, sorting and paging.
 * Each query chunk is an indexed prefix match on the normalised terms (art_terms: team, term).
 */
export async function searchArt(
  dataSource: DataSource,
  teamId: string,
  query: ArtListQuery,
): Promise<{ items: ArtView[]; total: number; page: number; pageSize: number }> {
  const where: string[] = ['a.team_id = ?', 'a.deleted_at IS NULL'];
  const params: unknown[] = [teamId];
  const term = (t: string) => {
    params.push(teamId, `${t}%`);
    return 'EXISTS (SELECT 1 FROM art_terms t WHERE t.art_id = a.id AND t.team_id = ? AND t.term LIKE ?)';
  };
  for (const chunk of queryChunks(query.q)) {
    const parts = chunk.parts.length > 1 ? ` OR (${chunk.parts.map(term).join(' AND ')})` : '';
    where.push(`(${term(chunk.joined)}${parts})`);
  }
  if (query.collectionId === 'none') where.push('NOT EXISTS (SELECT 1 FROM art_collections m WHERE m.art_id = a.id)');
  else if (query.collectionId) {
    where.push('EXISTS (SELECT 1 FROM art_collections m WHERE m.art_id = a.id AND m.collection_id = ?)');
    params.push(query.collectionId);
  }
  if (query.licence === 'none') where.push('COALESCE(a.licence_kind, c.licence_kind) IS NULL');
  else if (query.licence) {
    where.push('COALESCE(a.licence_kind, c.licence_kind) = ?');
    params.push(query.licence);
  }
  if (query.transparency) where.push(`a.has_transparency = ${query.transparency === 'yes' ? 1 : 0}`);
  if (query.uploadedBy) {
    where.push('a.uploaded_by = ?');
    params.push(query.uploadedBy);
  }
  if (query.from) {
    where.push('a.created_at >= ?');
    params.push(`${query.from} 00:00:00`);
  }
  if (query.to) {
    where.push('a.created_at < DATE_ADD(?, INTERVAL 1 DAY)');
    params.push(query.to);
  }
  const from = `FROM art_items a LEFT JOIN collections c ON c.id = a.pack_id WHERE ${where.join(' AND ')}`;
  const [{ total }] = await dataSource.query(`SELECT COUNT(*) AS total ${from}`, params);
  const order = `${SORTS[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, a.id ${query.dir === 'asc' ? 'ASC' : 'DESC'}`;
  const rows: Array<{ id: string }> = await dataSource.query(`SELECT a.id ${from} ORDER BY ${order} LIMIT ? OFFSET ?`, [
    ...params,
    query.pageSize,
    (query.page - 1) * query.pageSize,
  ]);
  const ids = rows.map((r) => String(r.id));
  const items = ids.length ? await dataSource.getRepository(ArtItem).findBy({ id: In(ids) }) : [];
  const byId = new Map(items.map((i) => [i.id, i]));
  const ordered = ids.map((id) => byId.get(id)!).filter(Boolean);
  return { items: await artViews(dataSource.manager, ordered), total: Number(total), page: query.page, pageSize: query.pageSize };
}
