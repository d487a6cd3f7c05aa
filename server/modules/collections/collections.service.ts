import { releaseKey } from '../../storage/sweep';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { CollectionView, LicenceInput } from '@shared/schemas/library';
import { AppError, conflict, notFound } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import { Collection } from './collection.entity';
import type { LicenceColumns } from './licence.columns';
import { licenceView } from './licence.columns';
import type { EntityManager } from 'typeorm';
import { inTransaction } from '../../db/transaction';

const licenceColumns = (l: LicenceInput | null, keep: LicenceColumns): LicenceColumns => ({
  kind: l?.kind ?? null,
  source: l?.source || null,
  notes: l?.notes || null,
  unitLimit: l?.unitLimit ?? null,
  proofKey: l ? keep.proofKey : null,
  proofName: l ? keep.proofName : null,
});

/** Shared collections of a team: listed by everyone, kept in order by owners and admins. */
export class CollectionsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    /** Told, inside the renaming transaction, which art carries a renamed collection's name (the
     * art module refreshes their search terms: it sits above this one and is handed in). */
    private readonly onRenamed: (manager: EntityManager, artIds: string[]) => Promise<void>,
  ) {}

  async list(teamId: string, includeArchived = true): Promise<CollectionView[]> {
    const rows = await this.dataSource.getRepository(Collection).find({ where: { teamId }, order: { position: 'ASC', id: 'ASC' } });
    // Raw SQL on purpose: art_collections and art_items belong to the art module, which sits above
    // collections (modules depend one way); counted by table name here.
    const counts: Array<{ collection_id: string; n: string }> = await this.dataSource.query(
      'SELECT m.collection_id, COUNT(*) AS n FROM art_collections m JOIN art_items a ON a.id = m.art_id WHERE a.team_id = ? AND a.deleted_at IS NULL GROUP BY m.collection_id',
      [teamId],
    );
    const count = new Map(counts.map((c) => [String(c.collection_id), Number(c.n)]));
    return rows
      .filter((c) => includeArchived || !c.archivedAt)
      .map((c) => ({
        id: c.id,
        name: c.name,
        position: c.position,
        membersCanAdd: c.membersCanAdd,
        archived: c.archivedAt !== null,
        artCount: count.get(c.id) ?? 0,
        licence: licenceView(c.licence, `/api/teams/${teamId}/collections/${c.id}/licence-proof`),
      }));
  }

  async find(teamId: string, id: string): Promise<Collection> {
    const collection = await this.dataSource.getRepository(Collection).findOneBy({ id, teamId });
    if (!collection) throw notFound('That collection');
    return collection;
  }

  private async ensureUniqueName(teamId: string, name: string, except?: string) {
    const same = await this.dataSource.getRepository(Collection).findOneBy({ teamId, name });
    if (same && same.id !== except) throw conflict('A collection with that name exists.', { name: 'Pick another name' });
  }

  async create(teamId: string, input: { name: string; membersCanAdd: boolean; licence?: LicenceInput | null }) {
    await this.ensureUniqueName(teamId, input.name);
    const { next } = (await this.dataSource
      .getRepository(Collection)
      .createQueryBuilder('c')
      .select('COALESCE(MAX(c.position), -1) + 1', 'next')
      .where('c.team_id = :teamId', { teamId })
      .getRawOne<{ next: string }>())!;
    const empty = { proofKey: null, proofName: null } as LicenceColumns;
    const saved = await this.dataSource.getRepository(Collection).save({
      teamId,
      name: input.name,
      membersCanAdd: input.membersCanAdd,
      position: Number(next),
      archivedAt: null,
      licence: licenceColumns(input.licence ?? null, empty),
    });
    return (await this.list(teamId)).find((c) => c.id === saved.id)!;
  }

  async update(
    teamId: string,
    id: string,
    input: { name?: string; membersCanAdd?: boolean; archived?: boolean; licence?: LicenceInput | null },
  ) {
    const collection = await this.find(teamId, id);
    if (input.name !== undefined) await this.ensureUniqueName(teamId, input.name, id);
    await inTransaction(this.dataSource, async (manager) => {
      const changes: Partial<Collection> = {};
      if (input.name !== undefined) changes.name = input.name;
      if (input.membersCanAdd !== undefined) changes.membersCanAdd = input.membersCanAdd;
      if (input.archived !== undefined) changes.archivedAt = input.archived ? (collection.archivedAt ?? new Date()) : null;
      if (input.licence !== undefined) changes.licence = licenceColumns(input.licence, collection.licence);
      if (Object.keys(changes).length) await manager.update(Collection, { id }, changes);
      if (input.name !== undefined && input.name !== collection.name) {
        // The collection's name is searchable through its art.
        // Raw on purpose: art_collections belongs to the art module, above this one (see list()).
        const ids: Array<{ id: string }> = await manager.query('SELECT art_id AS id FROM art_collections WHERE collection_id = ?', [id]);
        await this.onRenamed(
          manager,
          ids.map((r) => String(r.id)),
        );
      }
    });
    return (await this.list(teamId)).find((c) => c.id === id)!;
  }

  /** Sets the order to exactly the given ids (all of the team's collections). */
  async reorder(teamId: string, ids: string[]) {
    const all = await this.dataSource.getRepository(Collection).findBy({ teamId });
    const known = new Set(all.map((c) => c.id));
    if (ids.length !== all.length || new Set(ids).size !== ids.length || ids.some((i) => !known.has(i))) {
      throw new AppError(400, 'validation_failed', 'List every collection of the team exactly once.', {
        ids: 'List every collection exactly once',
      });
    }
    await inTransaction(this.dataSource, async (manager) => {
      for (const [position, id] of ids.entries()) await manager.update(Collection, { id, teamId }, { position });
    });
    return this.list(teamId);
  }

  async attachProof(teamId: string, id: string, file: { originalname: string; buffer: Buffer }) {
    const collection = await this.find(teamId, id);
    if (!collection.licence.kind) throw new AppError(409, 'conflict', 'Set the licence kind before attaching its proof.');
    const { key } = await this.storage.put(file.buffer);
    await this.dataSource
      .getRepository(Collection)
      .update({ id }, { licence: { ...collection.licence, proofKey: key, proofName: path.basename(file.originalname).slice(0, 200) } });
    if (collection.licence.proofKey !== key) await releaseKey(this.dataSource, this.storage, collection.licence.proofKey);
    return (await this.list(teamId)).find((c) => c.id === id)!;
  }

  async proof(teamId: string, id: string) {
    const collection = await this.find(teamId, id);
    if (!collection.licence.proofKey) throw notFound('That licence proof');
    return { name: collection.licence.proofName ?? 'licence-proof', data: await this.storage.get(collection.licence.proofKey) };
  }
}
