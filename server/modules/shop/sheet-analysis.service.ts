import { PAPER_SIZES } from '@shared/schemas/sheets';
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { SheetAnalysis } from '@shared/schemas/shop';
import { cutLength } from '@shared/production/cost';
import { inkCoverage } from '@shared/production/coverage';
import type { SheetDocument } from '@shared/sheet/document';
import { migrateDocument, pieceName } from '@shared/sheet/document';
import { pieceOutlineQuery, placeCutLine } from '@shared/sheet/placement';
import { pieceProblems } from '@shared/sheet/bounds';
import type { Finding, PreflightLimits, PreflightOutline } from '@shared/sheet/preflight';
import { countTearRisks, preflight, profileLimits } from '@shared/sheet/preflight';
import { renderPrintRaster } from '../../engine/export/print-image';
import type { ExportPiece } from '../../engine/export/types';
import type { Storage } from '../../storage/storage';
import { ArtItem } from '../art/art-item.entity';
import { effectiveLicenceKinds } from '../art/art-view';
import type { OutlineAccess, OutlineService, StoredOutline } from '../outlines/outline.service';
import { AppError } from '../../lib/errors';
import { SheetProfile } from '../sheets/sheet-profile.entity';
import { Sheet } from '../sheets/sheet.entity';
import { notFound } from '../../lib/errors';
import type { JobQueues } from '../../jobs/queues';
import type { PrintRaster } from '../../engine/export/print-image';
import { IsNull } from 'typeorm';
import sharp from 'sharp';

/** The width of a thumbnail drawn for a sheet that has none (the editor's own are this size too). */
const THUMBNAIL_WIDTH_PX = 240;

/** The resolution of the piece images the editor's outline requests cache, so the one a sheet can be rendered at from them. */
const ANALYSIS_DPI = 150;

/** A placed piece with its cached outline, as the print-image renderer takes it. */
async function toExportPiece(storage: Storage, piece: SheetDocument['pieces'][number], outline: StoredOutline): Promise<ExportPiece> {
  const first = outline.pieces[0];
  return {
    piece,
    name: '',
    cutLine: { points: first.cutLine.points, widthMm: first.widthMm, heightMm: first.heightMm },
    raster: { png: await storage.get(first.pngKey), widthMm: first.widthMm, heightMm: first.heightMm },
  };
}

type Gathered = {
  doc: SheetDocument;
  outlines: Map<string, PreflightOutline>;
  stored: Map<string, StoredOutline>;
  names: Map<string, string>;
  licences: Map<string, string | null>;
  paperArea: number;
  limits: PreflightLimits;
};

/**
 * What the server knows of a sheet version without exporting it: preflight findings, total cut
 * length and ink coverage. Outlines come from the same cache the editor fills (same options), and
 * coverage from the print image rendered at 150 DPI, which is plenty for a mean. Results are kept
 * on the sheet row for its version. With job queues the work is a job for a worker (the app waits
 * for it); a sheet with no thumbnail (made by the server, not the editor) gets one drawn from the
 * same print image.
 */
export class SheetAnalysisService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly outlines: OutlineService,
    private readonly queues: JobQueues | null = null,
  ) {}

  private async gather(teamId: string, sheet: Sheet, access: OutlineAccess = 'compute'): Promise<Gathered> {
    const doc = migrateDocument(JSON.parse(sheet.document));
    const profile = sheet.profileId ? await this.dataSource.getRepository(SheetProfile).findOneBy({ id: sheet.profileId }) : null;
    const limits = profileLimits(profile);
    const ids = [...new Set(doc.pieces.map((p) => p.artId))];
    const arts = new Map(
      (ids.length ? await this.dataSource.getRepository(ArtItem).findBy({ id: In(ids), teamId }) : []).map((a) => [a.id, a]),
    );
    const outlines = new Map<string, PreflightOutline>();
    const stored = new Map<string, StoredOutline>();
    const byQuery = new Map<string, StoredOutline>();
    for (const [index, piece] of doc.pieces.entries()) {
      const art = arts.get(piece.artId);
      // Out of bounds: preflight names it; no outline is made at an absurd size.
      if (!art || pieceProblems(doc, piece, index).length > 0) continue;
      const key = `${art.id}|${JSON.stringify(pieceOutlineQuery(piece, limits))}`;
      let outline = byQuery.get(key);
      if (!outline) {
        outline = (await this.outlines.forPiece(art, piece, limits, access)).outline;
        byQuery.set(key, outline);
      }
      const first = outline.pieces[0];
      stored.set(piece.id, outline);
      outlines.set(piece.id, {
        points: first.cutLine.points,
        widthMm: first.widthMm,
        heightMm: first.heightMm,
        effectiveDpi: outline.effectiveDpi,
        narrowNecks: countTearRisks(outline.warnings),
      });
    }
    const names = new Map(doc.pieces.map((p) => [p.id, pieceName(doc, p.id, (artId) => arts.get(artId)?.name)]));
    const paperArea = profile ? profile.paperWidthMm * profile.paperHeightMm : PAPER_SIZES.letter.width * PAPER_SIZES.letter.height;
    return { doc, outlines, stored, names, licences: await effectiveLicenceKinds(this.dataSource.manager, teamId, ids), paperArea, limits };
  }

  private findings(g: Gathered, sheet: Sheet, bleedMm?: number): Finding[] {
    return preflight({
      doc: g.doc,
      outlines: g.outlines,
      unit: sheet.unit,
      limits: g.limits,
      forSale: sheet.forSale,
      licenceOf: (p) => g.licences.get(p.artId),
      name: (p) => g.names.get(p.id) ?? 'A piece',
      bleedMm,
    });
  }

  /** Preflight as an export with this bleed would see it. */
  async preflightFor(teamId: string, sheet: Sheet, bleedMm: number): Promise<Finding[]> {
    return this.findings(await this.gather(teamId, sheet), sheet, bleedMm);
  }

  /** The analysis of the sheet's current version, computed once per version (by a worker when there are queues). */
  async analyse(teamId: string, sheet: Sheet, access: OutlineAccess = 'compute'): Promise<SheetAnalysis> {
    const kept = await this.kept(sheet);
    if (kept) return kept;
    if (this.queues) return this.queues.runAnalysis({ teamId, sheetId: sheet.id, version: sheet.version, access });
    return this.analyseSheet(teamId, sheet, access);
  }

  /**
   * Asks a worker to analyse a sheet the server just made (and so draw its thumbnail) without waiting;
   * without queues (the CLIs, the demo seeding) nothing happens here.
   */
  async soon(teamId: string, sheetId: string) {
    const sheet = await this.dataSource.getRepository(Sheet).findOneBy({ id: sheetId, teamId });
    if (sheet && this.queues) await this.queues.addAnalysis({ teamId, sheetId, version: sheet.version, access: 'compute' });
  }

  /** A worker's part: the sheet as it is now, analysed (unless that is done already). */
  async analyseNow(teamId: string, sheetId: string, access: OutlineAccess): Promise<SheetAnalysis> {
    const sheet = await this.dataSource.getRepository(Sheet).findOneBy({ id: sheetId, teamId });
    if (!sheet) throw notFound('That sheet');
    return (await this.kept(sheet)) ?? this.analyseSheet(teamId, sheet, access);
  }

  /** The analysis kept on the sheet row, if it is of this version. */
  private async kept(sheet: Sheet): Promise<SheetAnalysis | null> {
    const row = await this.dataSource
      .getRepository(Sheet)
      .findOne({ where: { id: sheet.id }, select: { id: true, analysisJson: true, analysisVersion: true } });
    return row?.analysisJson && row.analysisVersion === sheet.version ? JSON.parse(row.analysisJson) : null;
  }

  private async analyseSheet(teamId: string, sheet: Sheet, access: OutlineAccess): Promise<SheetAnalysis> {
    let g: Gathered;
    try {
      g = await this.gather(teamId, sheet, access);
    } catch (error) {
      if ((error as AppError).code === 'outline_not_made')
        throw new AppError(
          409,
          'not_analysed',
          'This sheet has not been checked since its last change: it is checked when someone who can edit it opens it.',
        );
      throw error;
    }
    const rings = g.doc.pieces.filter((p) => g.outlines.has(p.id)).map((p) => placeCutLine(p, g.outlines.get(p.id)!));
    const analysis: SheetAnalysis = {
      version: sheet.version,
      pieces: g.doc.pieces.length,
      cutLengthMm: cutLength(rings),
      coverage: await this.coverage(g, sheet),
      printAreaShare: (g.doc.printArea.width * g.doc.printArea.height) / g.paperArea,
      findings: this.findings(g, sheet),
    };
    // Only if the sheet is still at that version: a save meanwhile makes this one stale.
    await this.dataSource
      .getRepository(Sheet)
      .update({ id: sheet.id, version: sheet.version }, { analysisJson: JSON.stringify(analysis), analysisVersion: sheet.version });
    return analysis;
  }

  /** Ink coverage from the print image at 150 DPI; the same image makes a missing thumbnail. */
  private async coverage(g: Gathered, sheet: Sheet) {
    const pieces: ExportPiece[] = [];
    for (const piece of g.doc.pieces) {
      const outline = g.stored.get(piece.id);
      if (outline) pieces.push(await toExportPiece(this.storage, piece, outline));
    }
    const paper = { paperWidthMm: 0, paperHeightMm: 0, areaXMm: 0, areaYMm: 0 };
    const raster = await renderPrintRaster({ name: '', unit: 'mm', doc: g.doc, pieces, paper }, ANALYSIS_DPI, 'transparent');
    if (!sheet.thumbnailKey) await this.drawThumbnail(sheet, raster);
    return inkCoverage(raster.rgba, raster.width * raster.height);
  }

  /** A thumbnail for a sheet that has none, kept only if the sheet is still at that version without one. */
  private async drawThumbnail(sheet: Sheet, raster: PrintRaster) {
    const png = await sharp(raster.rgba, { raw: { width: raster.width, height: raster.height, channels: 4 } })
      .flatten({ background: '#ffffff' })
      .resize({ width: THUMBNAIL_WIDTH_PX })
      .png()
      .toBuffer();
    const { key } = await this.storage.put(png);
    await this.dataSource
      .getRepository(Sheet)
      .update({ id: sheet.id, version: sheet.version, thumbnailKey: IsNull() }, { thumbnailKey: key });
  }
}
