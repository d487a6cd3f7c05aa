import type { DataSource } from 'typeorm';
import type { ProfileInput, ProfileView } from '@shared/schemas/sheets';
import { PAPER_SIZES } from '@shared/schemas/sheets';
import { inchToMm } from '@shared/units';
import { conflict, notFound } from '../../lib/errors';
import { SheetProfile } from './sheet-profile.entity';
import { inTransaction } from '../../db/transaction';

/** Common practice for home cutters' print-and-cut: 6.75 × 9.25 in centred on Letter, 1/8 in gap. */
const DEFAULT_PROFILE: ProfileInput = {
  name: 'Letter print-and-cut',
  paper: 'letter',
  paperWidthMm: PAPER_SIZES.letter.width,
  paperHeightMm: PAPER_SIZES.letter.height,
  areaWidthMm: inchToMm(6.75),
  areaHeightMm: inchToMm(9.25),
  areaXMm: (PAPER_SIZES.letter.width - inchToMm(6.75)) / 2,
  areaYMm: (PAPER_SIZES.letter.height - inchToMm(9.25)) / 2,
  safeMarginMm: inchToMm(0.125),
  minGapMm: inchToMm(0.125),
  // Common practice: stickers under about 0.5 in lift off the liner; necks under 1 mm tear.
  smallestStickerMm: inchToMm(0.5),
  minFeatureMm: 1,
  // Common practice: bridges between parts of the art about 3 mm wide survive weeding and handling.
  bridgeWidthMm: 3,
  spotColour: 'CutContour',
  // Off: most cutters' own software prints its marks around the print area.
  regMarkShape: 'none',
  regMarkSizeMm: 5,
  regMarkOffsetMm: 5,
};

const view = (p: SheetProfile): ProfileView => ({
  id: p.id,
  name: p.name,
  paper: p.paper,
  paperWidthMm: p.paperWidthMm,
  paperHeightMm: p.paperHeightMm,
  areaWidthMm: p.areaWidthMm,
  areaHeightMm: p.areaHeightMm,
  areaXMm: p.areaXMm,
  areaYMm: p.areaYMm,
  safeMarginMm: p.safeMarginMm,
  minGapMm: p.minGapMm,
  smallestStickerMm: p.smallestStickerMm,
  minFeatureMm: p.minFeatureMm,
  bridgeWidthMm: p.bridgeWidthMm,
  spotColour: p.spotColour,
  regMarkShape: p.regMarkShape,
  regMarkSizeMm: p.regMarkSizeMm,
  regMarkOffsetMm: p.regMarkOffsetMm,
  isDefault: p.isDefault,
});

export class ProfilesService {
  constructor(private readonly dataSource: DataSource) {}

  /** The team's profiles; a team that has none gets the common-practice default first. */
  async list(teamId: string): Promise<ProfileView[]> {
    const repo = this.dataSource.getRepository(SheetProfile);
    let rows = await repo.find({ where: { teamId }, order: { id: 'ASC' } });
    if (rows.length === 0) {
      await repo.save({ ...DEFAULT_PROFILE, teamId, isDefault: true });
      rows = await repo.find({ where: { teamId }, order: { id: 'ASC' } });
    }
    return rows.map(view);
  }

  async find(teamId: string, id: string): Promise<SheetProfile> {
    const row = await this.dataSource.getRepository(SheetProfile).findOneBy({ id, teamId });
    if (!row) throw notFound('That sheet profile');
    return row;
  }

  async defaultFor(teamId: string): Promise<SheetProfile> {
    const all = await this.list(teamId);
    return this.find(teamId, (all.find((p) => p.isDefault) ?? all[0]).id);
  }

  async create(teamId: string, input: ProfileInput): Promise<ProfileView> {
    await this.list(teamId);
    return view(await this.dataSource.getRepository(SheetProfile).save({ ...input, teamId, isDefault: false }));
  }

  async update(teamId: string, id: string, input: ProfileInput, makeDefault: boolean): Promise<ProfileView> {
    await this.find(teamId, id);
    const fields: ProfileInput = { ...input };
    await inTransaction(this.dataSource, async (manager) => {
      if (makeDefault) await manager.update(SheetProfile, { teamId }, { isDefault: false });
      await manager.update(SheetProfile, { id, teamId }, { ...fields, ...(makeDefault ? { isDefault: true } : {}) });
    });
    return view(await this.find(teamId, id));
  }

  async remove(teamId: string, id: string): Promise<void> {
    const profile = await this.find(teamId, id);
    if (profile.isDefault) throw conflict('Make another profile the default before deleting this one.');
    await this.dataSource.getRepository(SheetProfile).delete({ id, teamId });
  }
}
