// Join rows written as ordered diffs (DEVELOPERS.md: never delete-all + insert): a parent's rows are
// brought to exactly the wanted set by deleting the ones gone and inserting the new ones, each in id
// order, so concurrent writers take their row locks in the same order.
import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import { In } from 'typeorm';

/** Orders numeric id strings (BIGINT) by value. */
export const byId = (a: string, b: string) => (BigInt(a) < BigInt(b) ? -1 : BigInt(a) > BigInt(b) ? 1 : 0);

/**
 * Makes the rows of `entity` under `parent` (e.g. { artId }) hold exactly the ids `want` in column
 * `child`; answers which ids were added and which were gone.
 */
export async function syncJoinRows<E extends ObjectLiteral>(
  manager: EntityManager,
  entity: EntityTarget<E>,
  parent: Record<string, string>,
  child: string,
  want: Iterable<string>,
): Promise<{ added: string[]; gone: string[] }> {
  const wanted = new Set(want);
  const rows = await manager.getRepository(entity).find({ where: parent as never, select: { [child]: true } as never });
  const have = new Set(rows.map((r) => String(r[child])));
  const gone = [...have].filter((id) => !wanted.has(id)).sort(byId);
  const added = [...wanted].filter((id) => !have.has(id)).sort(byId);
  if (gone.length) await manager.getRepository(entity).delete({ ...parent, [child]: In(gone) } as never);
  if (added.length)
    await manager
      .createQueryBuilder()
      .insert()
      .into(entity)
      .values(added.map((id) => ({ ...parent, [child]: id })) as never)
      .orIgnore()
      .execute();
  return { added, gone };
}
