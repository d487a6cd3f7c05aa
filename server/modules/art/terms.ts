// Keywords and search terms of art, through their entities. Rows change as ordered diffs (only the
// rows that change, items and words in ascending order, INSERT IGNORE): a blanket delete + insert
// deadlocked parallel uploads into one team.
import type { EntityManager } from 'typeorm';
import { Brackets, In } from 'typeorm';
import { normaliseKeyword, searchTerms } from '@shared/search';
import { ArtCollection } from './art-collection.entity';
import { ArtItem } from './art-item.entity';
import { ArtKeyword, ArtTerm } from './art-index.entity';
import { Collection } from '../collections/collection.entity';
import { vocabularyChanged } from './vocabulary';

/** Keywords of many items at once: art id → sorted keywords. */
export async function keywordsOf(manager: EntityManager, artIds: string[]): Promise<Map<string, string[]>> {
  const map = new Map<string, string[]>(artIds.map((id) => [id, []]));
  if (artIds.length === 0) return map;
  const rows = await manager.getRepository(ArtKeyword).find({ where: { artId: In(artIds) }, order: { keyword: 'ASC' } });
  for (const row of rows) map.get(String(row.artId))?.push(row.keyword);
  return map;
}

const sorted = (values: Iterable<string>) => [...values].sort();

export async function addKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = sorted(new Set(keywords.map(normaliseKeyword).filter(Boolean)));
  if (clean.length === 0) return;
  await manager
    .createQueryBuilder()
    .insert()
    .into(ArtKeyword)
    .values(clean.map((keyword) => ({ artId, keyword })))
    .orIgnore()
    .execute();
}

export async function removeKeywords(manager: EntityManager, artId: string, keywords: string[]) {
  const clean = sorted(new Set(keywords.map(normaliseKeyword).filter(Boolean)));
  if (clean.length === 0) return;
  await manager.getRepository(ArtKeyword).delete({ artId, keyword: In(clean) });
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
 * diff (only changed rows, items and terms in ascending order).
 */
export async function refreshTerms(manager: EntityManager, artIds: string[]) {
  if (artIds.length === 0) return;
  const ids = [...new Set(artIds)].sort((a, b) => (BigInt(a) < BigInt(b) ? -1 : 1));
  const items: Array<{ id: string; team_id: string; name: string; collection: string | null }> = await manager
    .getRepository(ArtItem)
    .createQueryBuilder('a')
    .leftJoin(ArtCollection, 'm', 'm.art_id = a.id')
    .leftJoin(Collection, 'c', 'c.id = m.collection_id')
    .select('a.id', 'id')
    .addSelect('a.team_id', 'team_id')
    .addSelect('a.name', 'name')
    .addSelect("GROUP_CONCAT(c.name ORDER BY c.id SEPARATOR ' ')", 'collection')
    .where('a.id IN (:...ids)', { ids })
    .groupBy('a.id')
    .addGroupBy('a.team_id')
    .addGroupBy('a.name')
    .getRawMany();
  const keywords = await keywordsOf(manager, ids);
  const current = await manager.getRepository(ArtTerm).find({ where: { artId: In(ids) }, select: { artId: true, term: true } });
  const have = new Map<string, Set<string>>(ids.map((id) => [id, new Set()]));
  for (const row of current) have.get(String(row.artId))?.add(row.term);
  const gone: Array<[string, string]> = [];
  const added: ArtTerm[] = [];
  for (const item of items) {
    const id = String(item.id);
    const want = new Set(searchTerms(item.name, item.collection ?? '', ...(keywords.get(id) ?? [])));
    const old = have.get(id) ?? new Set<string>();
    for (const term of sorted(old)) if (!want.has(term)) gone.push([id, term]);
    for (const term of sorted(want)) if (!old.has(term)) added.push({ teamId: String(item.team_id), artId: id, term });
  }
  if (gone.length || added.length) vocabularyChanged(new Set(items.map((i) => String(i.team_id))));
  for (let i = 0; i < gone.length; i += 500) {
    const batch = gone.slice(i, i + 500);
    await manager
      .createQueryBuilder()
      .delete()
      .from(ArtTerm)
      .where(
        new Brackets((qb) => {
          batch.forEach(([artId, term], k) => qb.orWhere(`(art_id = :a${k} AND term = :t${k})`, { [`a${k}`]: artId, [`t${k}`]: term }));
        }),
      )
      .execute();
  }
  for (let i = 0; i < added.length; i += 500)
    await manager
      .createQueryBuilder()
      .insert()
      .into(ArtTerm)
      .values(added.slice(i, i + 500))
      .orIgnore()
      .execute();
}
