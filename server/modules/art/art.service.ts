import path from 'node:path';
import { releaseKey } from '../../storage/sweep';
import { createHash } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { In, IsNull } from 'typeorm';
import { can } from '@shared/permissions';
import type { ArtUpdateInput, ArtView, BulkAction, UploadResult } from '@shared/schemas/library';
import { suggestKeywords } from '@shared/search';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import { Collection } from '../collections/collection.entity';
import { ArtCollection } from './art-collection.entity';
import { setCollections } from './memberships';
import { ArtItem } from './art-item.entity';
import { artViews } from './art-view';
import { addKeywords, refreshTerms, removeKeywords, setKeywords } from './terms';
import { inTransaction, isDuplicateOf } from '../../db/transaction';
import type { PackLimits } from './zip-pack';
import { DEFAULT_PACK_LIMITS, readPack } from './zip-pack';

import type { Actor } from '@shared/permissions';
import { drawnArt, isZip, nameFrom, sniffArt } from './art-files';
import type { ReadyArt } from './art-files';

export class ArtService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly maxPixels: number,
    private readonly packLimits: PackLimits = DEFAULT_PACK_LIMITS,
  ) {}

  private async writableCollection(
    actor: Actor,
    collectionId: string | null | undefined,
    manager: EntityManager = this.dataSource.manager,
  ) {
    if (!collectionId) return null;
    const collection = await manager.findOneBy(Collection, { id: collectionId, teamId: actor.teamId });
    if (!collection) throw notFound('That collection');
    if (collection.archivedAt) throw new AppError(409, 'conflict', `"${collection.name}" is archived. Restore it before adding art.`);
    if (!can(actor.role, 'library.manage') && !collection.membersCanAdd)
      throw forbidden(`Only owners and admins add art to "${collection.name}".`);
    return collection;
  }

  /**
   * Takes one upload: an image, or a zip of a whole pack. Everything is checked before anything is
   * stored; rows go in one transaction, and files written for a failed batch are removed again.
   */
  async upload(
    actor: Actor,
    file: { originalname: string; buffer: Buffer },
    fields: { keywords: string[]; collectionId?: string },
  ): Promise<UploadResult[]> {
    const collection = await this.writableCollection(actor, fields.collectionId);
    const zipped = isZip(file.buffer);
    const entries = zipped
      ? await readPack(file.buffer, this.packLimits)
      : { images: [{ path: file.originalname, folders: [], data: file.buffer }], skipped: [] };
    // A single bad file is refused outright; inside a pack, each bad image is reported by name.
    if (!zipped) await sniffArt((await drawnArt(file.buffer, this.maxPixels)).data, this.maxPixels);

    const results: UploadResult[] = entries.skipped.map((s) => ({ file: s.path, status: 'skipped', reason: s.reason }));
    const fresh: ReadyArt[] = [];
    const seen = new Map<string, string>();
    for (const entry of entries.images) {
      const sha256 = createHash('sha256').update(entry.data).digest('hex');
      if (seen.has(sha256)) {
        results.push({ file: entry.path, status: 'duplicate', reason: `Same image as ${seen.get(sha256)} in this upload.` });
        continue;
      }
      seen.set(sha256, entry.path);
      try {
        // Vector art is drawn at the print DPI here; its identity stays the file's own bytes.
        const { data, source } = await drawnArt(entry.data, this.maxPixels);
        fresh.push({ ...entry, data, source, sha256, info: await sniffArt(data, this.maxPixels) });
      } catch (error) {
        results.push({ file: entry.path, status: 'rejected', reason: (error as Error).message });
      }
    }

    const written: string[] = [];
    const put = async (data: Buffer) => {
      const key = createHash('sha256').update(data).digest('hex');
      if (!(await this.storage.exists(key))) written.push(key);
      return (await this.storage.put(data)).key;
    };
    try {
      const stored = await inTransaction(
        this.dataSource,
        async (manager) => {
          const out: Array<{ path: string; id: string; status: 'stored' | 'duplicate'; suggested: string[] }> = [];
          // Read inside the transaction: a teammate's upload of the same image that committed
          // meanwhile is seen on the retry below and reported as a duplicate.
          const existing = fresh.length
            ? await manager.findBy(ArtItem, { teamId: actor.teamId, sha256: In(fresh.map((f) => f.sha256)) })
            : [];
          const bySha = new Map(existing.map((e) => [e.sha256, e]));
          for (const entry of fresh) {
            const suggested = zipped ? suggestKeywords(entry.path) : suggestKeywords(file.originalname);
            const old = bySha.get(entry.sha256);
            if (old && !old.deletedAt) {
              out.push({ path: entry.path, id: old.id, status: 'duplicate', suggested });
              continue;
            }
            const storageKey = await put(entry.data);
            const thumbnailKey = await put(entry.info.thumbnail);
            const sourceKey = entry.source === null ? null : await put(Buffer.from(entry.source));
            const sourceFormat = entry.source === null ? null : ('svg' as const);
            let id: string;
            if (old) {
              await manager.update(ArtItem, { id: old.id }, { deletedAt: null, storageKey, thumbnailKey, sourceKey, sourceFormat });
              id = old.id;
            } else {
              const item = await manager.save(
                manager.create(ArtItem, {
                  teamId: actor.teamId,
                  packId: collection?.id ?? null,
                  name: nameFrom(entry.path),
                  sha256: entry.sha256,
                  storageKey,
                  thumbnailKey,
                  sourceKey,
                  sourceFormat,
                  format: entry.info.format,
                  sizeBytes: entry.data.length,
                  widthPx: entry.info.width,
                  heightPx: entry.info.height,
                  hasTransparency: entry.info.hasTransparency,
                  uploadedBy: actor.userId,
                  deletedAt: null,
                }),
              );
              id = item.id;
            }
            if (collection)
              await manager
                .createQueryBuilder()
                .insert()
                .into(ArtCollection)
                .values({ artId: id, collectionId: collection.id })
                .orIgnore()
                .execute();
            // Folder names inside a pack become keywords, with the batch's own keywords.
            await addKeywords(manager, id, [
              ...fields.keywords,
              ...(zipped ? entry.folders.flatMap((f) => suggestKeywords(`${f}/x`)) : []),
            ]);
            out.push({ path: entry.path, id, status: 'stored', suggested });
          }
          await refreshTerms(
            manager,
            out.filter((o) => o.status === 'stored').map((o) => o.id),
          );
          return out;
        },
        { retryIf: isDuplicateOf('uq_art_items_team_sha') },
      );
      const items = await this.dataSource.getRepository(ArtItem).findBy({ id: In(stored.map((s) => s.id)) });
      const views = new Map((await artViews(this.dataSource.manager, items)).map((v) => [v.id, v]));
      for (const s of stored)
        results.push({
          file: s.path,
          status: s.status,
          item: views.get(s.id),
          suggestedKeywords: s.suggested,
          reason: s.status === 'duplicate' ? 'Already in the library.' : undefined,
        });
      return results;
    } catch (error) {
      // Remove what this batch wrote, unless a concurrent upload has started using the same bytes.
      for (const key of written) {
        const used = await this.dataSource
          .getRepository(ArtItem)
          .count({ where: [{ storageKey: key }, { thumbnailKey: key }, { sourceKey: key }] });
        if (used === 0) await this.storage.delete(key).catch(() => undefined);
      }
      throw error;
    }
  }

  async find(teamId: string, artId: string): Promise<ArtItem> {
    const item = await this.dataSource.getRepository(ArtItem).findOneBy({ id: artId, teamId, deletedAt: IsNull() });
    if (!item) throw notFound('That art');
    return item;
  }

  async view(teamId: string, artId: string): Promise<ArtView> {
    const [view] = await artViews(this.dataSource.manager, [await this.find(teamId, artId)]);
    return view;
  }

  bytes(key: string): Promise<Buffer> {
    return this.storage.get(key);
  }

  async update(actor: Actor, artId: string, input: ArtUpdateInput): Promise<ArtView> {
    const item = await this.find(actor.teamId, artId);
    const manage = can(actor.role, 'library.manage');
    if (input.licence !== undefined && !manage) throw forbidden('Only owners and admins change licences.');
    await inTransaction(this.dataSource, async (manager) => {
      const changes: Partial<ArtItem> = {};
      if (input.name !== undefined) changes.name = input.name;
      if (input.collectionIds !== undefined) await this.changeCollections(actor, item, input.collectionIds, manager);
      if (input.background) {
        changes.backgroundMode = input.background.mode;
        changes.backgroundColour = input.background.mode === 'colour' ? input.background.colour!.toLowerCase() : null;
        changes.backgroundTolerance = input.background.tolerance;
      }
      if (input.widenNecks !== undefined) changes.widenNecks = input.widenNecks;
      if (input.licence !== undefined) {
        const l = input.licence;
        Object.assign(changes, {
          licence: {
            kind: l?.kind ?? null,
            source: l?.source || null,
            notes: l?.notes || null,
            unitLimit: l?.unitLimit ?? null,
            proofKey: l ? item.licence.proofKey : null,
            proofName: l ? item.licence.proofName : null,
          },
        });
      }
      if (Object.keys(changes).length) await manager.update(ArtItem, { id: item.id }, changes);
      if (input.keywords !== undefined) {
        await setKeywords(manager, item.id, input.keywords);
      }
      await refreshTerms(manager, [item.id]);
    });
    return this.view(actor.teamId, artId);
  }

  /**
   * Puts the art in exactly `targets`. Owners and admins add to and take from any collection;
   * members only those open to members. The art's licence (its own or its pack's) is untouched.
   */
  private async changeCollections(actor: Actor, item: ArtItem, targets: string[], manager: EntityManager) {
    const current = new Set((await manager.findBy(ArtCollection, { artId: item.id })).map((l) => l.collectionId));
    const wanted = [...new Set(targets)];
    for (const id of wanted) if (!current.has(id)) await this.writableCollection(actor, id, manager);
    if (!can(actor.role, 'library.manage')) {
      const leaving = [...current].filter((id) => !wanted.includes(id));
      const closed = leaving.length ? await manager.findBy(Collection, { id: In(leaving), membersCanAdd: false }) : [];
      if (closed.length) throw forbidden(`Only owners and admins take art out of "${closed[0].name}".`);
    }
    await setCollections(manager, item.id, wanted);
  }

  async bulk(actor: Actor, action: BulkAction): Promise<{ changed: number }> {
    const items = await this.dataSource.getRepository(ArtItem).findBy({ id: In(action.ids), teamId: actor.teamId, deletedAt: IsNull() });
    if (items.length !== new Set(action.ids).size) throw notFound('Some of that art');
    if (action.action === 'delete') return this.remove(actor, items);
    await inTransaction(this.dataSource, async (manager) => {
      for (const item of items) {
        if (action.action === 'addKeyword') await addKeywords(manager, item.id, [action.keyword]);
        else if (action.action === 'removeKeyword') await removeKeywords(manager, item.id, [action.keyword]);
        else {
          // "Move": the art leaves its other collections for this one (or all of them, for none).
          await this.changeCollections(actor, item, action.collectionId ? [action.collectionId] : [], manager);
        }
      }
      await refreshTerms(
        manager,
        items.map((i) => i.id),
      );
    });
    return { changed: items.length };
  }

  /**
   * Soft delete: the row and the file stay, so sheets that use the art stay printable; the art
   * leaves the library's lists and search. Owners and admins delete anything, members their own uploads.
   */
  async remove(actor: Actor, items: ArtItem[]): Promise<{ changed: number }> {
    if (!can(actor.role, 'library.manage') && items.some((i) => i.uploadedBy !== actor.userId)) {
      throw forbidden('Members delete only art they uploaded. Ask an owner or admin.');
    }
    await this.dataSource.getRepository(ArtItem).update({ id: In(items.map((i) => i.id)) }, { deletedAt: new Date() });
    return { changed: items.length };
  }

  async attachProof(actor: Actor, artId: string, file: { originalname: string; buffer: Buffer }): Promise<ArtView> {
    if (!can(actor.role, 'library.manage')) throw forbidden('Only owners and admins change licences.');
    const item = await this.find(actor.teamId, artId);
    if (!item.licence.kind) throw new AppError(409, 'conflict', 'Set the licence kind before attaching its proof.');
    const { key } = await this.storage.put(file.buffer);
    await this.dataSource
      .getRepository(ArtItem)
      .update({ id: item.id }, { licence: { ...item.licence, proofKey: key, proofName: path.basename(file.originalname).slice(0, 200) } });
    // The proof it replaces goes with it, unless another row still uses the same file.
    if (item.licence.proofKey !== key) await releaseKey(this.dataSource, this.storage, item.licence.proofKey);
    return this.view(actor.teamId, artId);
  }
}
