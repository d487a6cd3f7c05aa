import { releaseKey } from '../../storage/sweep';
import type { DataSource, EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { SheetDocument } from '@shared/sheet/document';
import { emptyDocument, migrateDocument } from '@shared/sheet/document';
import type { SheetDetail, SheetSaveInput, SheetSummary } from '@shared/schemas/sheets';
import { AppError, notFound, validationError } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import { User } from '../accounts/user.entity';
import { ArtItem } from '../art/art-item.entity';
import { effectiveLicenceKinds } from '../art/art-view';
import type { ProfilesService } from './profiles.service';
import { SheetProfile } from './sheet-profile.entity';
import { Sheet } from './sheet.entity';
import { SheetArt } from './sheet-art.entity';
import { inTransaction } from '../../db/transaction';
import { syncJoinRows } from '../../db/join-rows';
import { cleanThumbnail, refuseOutOfBounds } from './sheet-checks';
import { profileLimits } from '@shared/sheet/preflight';

import type { Actor } from '@shared/permissions';

export class SheetsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly profiles: ProfilesService,
  ) {}

  private async summaries(rows: Sheet[]): Promise<SheetSummary[]> {
    if (rows.length === 0) return [];
    const users = new Map(
      (await this.dataSource.getRepository(User).findBy({ id: In([...new Set(rows.map((r) => r.ownerId))]) })).map((u) => [u.id, u]),
    );
    const profileIds = [...new Set(rows.map((r) => r.profileId).filter((id): id is string => id !== null))];
    const profiles = new Map(
      (profileIds.length ? await this.dataSource.getRepository(SheetProfile).findBy({ id: In(profileIds) }) : []).map((p) => [p.id, p]),
    );
    const exportRows: Array<{
      id: string;
      sheet_id: string;
      sheet_version: number;
      status: 'running' | 'done' | 'failed';
      progress: string;
    }> = await this.dataSource.query(
      // Raw SQL on purpose: sheet_exports belongs to the exports module, which sits above sheets
      // (modules depend one way), and the newest row per sheet is a grouped self-join.
      `SELECT e.id, e.sheet_id, e.sheet_version, e.status, e.progress FROM sheet_exports e
       JOIN (SELECT sheet_id, MAX(id) AS id FROM sheet_exports WHERE sheet_id IN (${rows.map(() => '?').join(',')}) GROUP BY sheet_id) last ON last.id = e.id`,
      rows.map((r) => r.id),
    );
    const exportsBySheet = new Map(exportRows.map((e) => [String(e.sheet_id), e]));
    return rows.map((r) => ({
      id: r.id,
      name: r.name,
      status: r.status,
      forSale: r.forSale,
      isTemplate: r.isTemplate,
      unit: r.unit,
      pieceCount: r.pieceCount,
      areaUsed: r.areaUsed,
      version: r.version,
      owner: { id: r.ownerId, name: users.get(r.ownerId)?.name ?? 'Former member' },
      profile: r.profileId && profiles.get(r.profileId) ? { id: r.profileId, name: profiles.get(r.profileId)!.name } : null,
      updatedAt: r.updatedAt.toISOString(),
      thumbnailUrl: r.thumbnailKey ? `/api/teams/${r.teamId}/sheets/${r.id}/thumbnail?v=${r.version}` : null,
      lastExport: (() => {
        const e = exportsBySheet.get(r.id);
        if (!e) return null;
        return {
          status: e.status,
          progress: Number(e.progress),
          current: e.sheet_version === r.version,
          downloadUrl: e.status === 'done' ? `/api/teams/${r.teamId}/sheets/${r.id}/exports/${e.id}/download` : null,
        };
      })(),
    }));
  }

  async list(
    teamId: string,
    query: { q: string; status?: string; ownerId?: string; templates: 'only' | 'exclude' },
  ): Promise<SheetSummary[]> {
    const qb = this.dataSource
      .getRepository(Sheet)
      .createQueryBuilder('s')
      .where('s.team_id = :teamId', { teamId })
      .andWhere('s.is_template = :t', { t: query.templates === 'only' ? 1 : 0 });
    if (query.q) qb.andWhere('s.name LIKE :q', { q: `%${query.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%` });
    if (query.status) qb.andWhere('s.status = :status', { status: query.status });
    if (query.ownerId) qb.andWhere('s.owner_id = :owner', { owner: query.ownerId });
    return this.summaries(await qb.orderBy('s.updated_at', 'DESC').limit(500).getMany());
  }

  async find(teamId: string, id: string): Promise<Sheet> {
    const sheet = await this.dataSource.getRepository(Sheet).findOneBy({ id, teamId });
    if (!sheet) throw notFound('That sheet');
    return sheet;
  }

  async detail(teamId: string, id: string): Promise<SheetDetail> {
    const sheet = await this.find(teamId, id);
    const [summary] = await this.summaries([sheet]);
    const document = migrateDocument(JSON.parse(sheet.document));
    const ids = [...new Set(document.pieces.map((p) => p.artId))];
    const art = ids.length ? await this.dataSource.getRepository(ArtItem).findBy({ id: In(ids), teamId }) : [];
    const licences = await effectiveLicenceKinds(this.dataSource.manager, teamId, ids);
    const profile = sheet.profileId ? await this.dataSource.getRepository(SheetProfile).findOneBy({ id: sheet.profileId }) : null;
    return {
      ...summary,
      notes: sheet.notes ?? '',
      document,
      artNames: Object.fromEntries(art.map((a) => [a.id, a.name])),
      artLicences: Object.fromEntries(licences),
      limits: profileLimits(profile),
      printing: {
        spotColour: profile?.spotColour ?? 'CutContour',
        marks:
          profile && profile.regMarkShape !== 'none'
            ? { shape: profile.regMarkShape, sizeMm: profile.regMarkSizeMm, offsetMm: profile.regMarkOffsetMm }
            : null,
      },
    };
  }

  /** Every art item a document uses must be the team's own (a deleted one still counts). */
  private async checkArt(manager: EntityManager, teamId: string, doc: SheetDocument): Promise<string[]> {
    const ids = [...new Set(doc.pieces.map((p) => p.artId))];
    if (ids.length === 0) return [];
    const found = await manager.getRepository(ArtItem).countBy({ id: In(ids), teamId });
    if (found !== ids.length)
      throw validationError({ document: 'The sheet uses art this team does not have' }, 'The sheet uses art this team does not have.');
    return ids;
  }

  /**
   * Makes sheet_art hold exactly `artIds` for the sheet, as an ordered diff: only rows that change
   * are touched, in ascending id order, so parallel saves of different sheets rarely lock the same
   * index ranges (a blanket delete + insert deadlocked 12 of 20 parallel saves).
   */
  private async linkArt(manager: EntityManager, sheetId: string, artIds: string[]) {
    await syncJoinRows(manager, SheetArt, { sheetId }, 'artId', artIds);
  }

  async create(
    actor: Actor,
    input: { name: string; profileId?: string; unit?: 'in' | 'mm'; fromTemplateId?: string },
  ): Promise<SheetDetail> {
    const profile = input.profileId
      ? await this.profiles.find(actor.teamId, input.profileId)
      : await this.profiles.defaultFor(actor.teamId);
    const template = input.fromTemplateId ? await this.find(actor.teamId, input.fromTemplateId) : null;
    if (template && !template.isTemplate) throw notFound('That template');
    const document = template ? migrateDocument(JSON.parse(template.document)) : emptyDocument(profile);
    const id = await inTransaction(this.dataSource, async (manager) => {
      const artIds = await this.checkArt(manager, actor.teamId, document);
      const sheet = await manager.save(
        manager.create(Sheet, {
          teamId: actor.teamId,
          ownerId: actor.userId,
          profileId: template?.profileId ?? profile.id,
          name: input.name,
          unit: input.unit ?? template?.unit ?? 'in',
          status: 'draft',
          forSale: template?.forSale ?? false,
          notes: template?.notes ?? null,
          version: 1,
          document: JSON.stringify(document),
          isTemplate: false,
          pieceCount: document.pieces.length,
          areaUsed: template?.areaUsed ?? 0,
          thumbnailKey: template?.thumbnailKey ?? null,
          updatedBy: actor.userId,
        }),
      );
      await this.linkArt(manager, sheet.id, artIds);
      return sheet.id;
    });
    return this.detail(actor.teamId, id);
  }

  /**
   * Saves changes made on top of `version`. A save based on an older version answers 409 with who
   * saved last, so a teammate's work is never silently overwritten.
   */
  async save(actor: Actor, id: string, input: SheetSaveInput): Promise<SheetDetail> {
    let thumbnailKey: string | undefined;
    let replacedThumbnail: string | null = null;
    if (input.thumbnail) thumbnailKey = (await this.storage.put(await cleanThumbnail(input.thumbnail))).key;
    await inTransaction(this.dataSource, async (manager) => {
      const sheet = await manager
        .getRepository(Sheet)
        .findOne({ where: { id, teamId: actor.teamId }, lock: { mode: 'pessimistic_write' } });
      if (!sheet) throw notFound('That sheet');
      if (sheet.version !== input.version) {
        const who = sheet.updatedBy ? await manager.getRepository(User).findOneBy({ id: sheet.updatedBy }) : null;
        const error = new AppError(
          409,
          'version_conflict',
          `${who?.name ?? 'Someone'} saved this sheet since you opened it (version ${sheet.version}, yours ${input.version}).`,
        );
        throw Object.assign(error, { fields: { version: String(sheet.version) } });
      }
      // Only a change to what the maker made is a new version: a save that brings nothing but the area
      // used and the preview (the editor's second save once outlines arrive) keeps the version, so an
      // export made meanwhile stays the current one.
      const stored = { name: sheet.name, unit: sheet.unit, status: sheet.status, forSale: sheet.forSale, notes: sheet.notes ?? '' };
      const made = (['name', 'unit', 'status', 'forSale', 'notes'] as const).some((k) => input[k] !== undefined && input[k] !== stored[k]);
      const newDocument = input.document !== undefined && JSON.stringify(input.document) !== sheet.document;
      const changes: Partial<Sheet> = made || newDocument ? { version: sheet.version + 1, updatedBy: actor.userId } : {};
      for (const key of ['name', 'unit', 'status', 'forSale', 'notes', 'areaUsed'] as const)
        if (input[key] !== undefined) Object.assign(changes, { [key]: input[key] });
      if (thumbnailKey) changes.thumbnailKey = thumbnailKey;
      replacedThumbnail = thumbnailKey && sheet.thumbnailKey !== thumbnailKey ? sheet.thumbnailKey : null;
      if (input.document && newDocument) {
        refuseOutOfBounds(input.document, input.unit ?? sheet.unit);
        changes.document = JSON.stringify(input.document);
        changes.pieceCount = input.document.pieces.length;
        await this.linkArt(manager, id, await this.checkArt(manager, actor.teamId, input.document));
      }
      await manager.update(Sheet, { id }, changes);
    });
    // The preview it replaced, unless a copy of the sheet (or anything else) still shows it.
    await releaseKey(this.dataSource, this.storage, replacedThumbnail);
    return this.detail(actor.teamId, id);
  }

  async duplicate(actor: Actor, id: string, input: { name?: string; asTemplate: boolean }): Promise<SheetDetail> {
    const source = await this.find(actor.teamId, id);
    const copyId = await inTransaction(this.dataSource, async (manager) => {
      const { id: _id, createdAt: _c, updatedAt: _u, ...rest } = source;
      const copy = await manager.save(
        manager.create(Sheet, {
          ...rest,
          ownerId: actor.userId,
          name: input.name ?? `${source.name} (copy)`,
          version: 1,
          isTemplate: input.asTemplate,
          status: 'draft',
          updatedBy: actor.userId,
        }),
      );
      await this.linkArt(manager, copy.id, [...new Set(migrateDocument(JSON.parse(source.document)).pieces.map((p) => p.artId))]);
      return copy.id;
    });
    return this.detail(actor.teamId, copyId);
  }

  async remove(actor: Actor, id: string): Promise<void> {
    await this.find(actor.teamId, id);
    await this.dataSource.getRepository(Sheet).delete({ id, teamId: actor.teamId });
  }

  async thumbnail(teamId: string, id: string): Promise<Buffer> {
    const sheet = await this.find(teamId, id);
    if (!sheet.thumbnailKey) throw notFound('That thumbnail');
    return this.storage.get(sheet.thumbnailKey);
  }

  /** Names of the sheets that use an art item, for the question before deleting it. */
  async usingArt(teamId: string, artIds: string[]): Promise<string[]> {
    if (artIds.length === 0) return [];
    const rows: Array<{ name: string }> = await this.dataSource
      .getRepository(SheetArt)
      .createQueryBuilder('sa')
      .innerJoin(Sheet, 's', 's.id = sa.sheet_id')
      .select('DISTINCT s.name', 'name')
      .where('s.team_id = :teamId AND sa.art_id IN (:...artIds)', { teamId, artIds })
      .orderBy('s.name')
      .getRawMany();
    return rows.map((r) => r.name);
  }
}
