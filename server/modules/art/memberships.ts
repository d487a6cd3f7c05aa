import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import { Collection } from '../collections/collection.entity';
import { ArtCollection } from './art-collection.entity';
import { byId, syncJoinRows } from '../../db/join-rows';

/** The collections each item is in, in the team's collection order. */
export async function collectionsOf(manager: EntityManager, artIds: string[]): Promise<Map<string, Collection[]>> {
  const out = new Map<string, Collection[]>(artIds.map((id) => [id, []]));
  if (artIds.length === 0) return out;
  const links = await manager.findBy(ArtCollection, { artId: In(artIds) });
  const collections = new Map(
    (links.length ? await manager.findBy(Collection, { id: In([...new Set(links.map((l) => l.collectionId))]) }) : []).map((c) => [
      c.id,
      c,
    ]),
  );
  for (const link of links) {
    const c = collections.get(link.collectionId);
    if (c) out.get(link.artId)?.push(c);
  }
  for (const list of out.values()) list.sort((a, b) => a.position - b.position || byId(a.id, b.id));
  return out;
}

/** Makes `artId` a member of exactly `collectionIds`, as an ordered diff (rows touched in id order). */
export async function setCollections(manager: EntityManager, artId: string, collectionIds: string[]) {
  return syncJoinRows(manager, ArtCollection, { artId }, 'collectionId', collectionIds);
}
