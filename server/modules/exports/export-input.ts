// What an export job works from: each piece outlined again at the export's resolution (the same
// request the editor's outline was made from), the paper and print area from the sheet's profile
// (Letter with the area centred when it has none), and the profile's cut-layer colour and marks.
import type { DataSource } from 'typeorm';
import type { ExportRequest } from '@shared/schemas/exports';
import { PAPER_SIZES } from '@shared/schemas/sheets';
import type { SheetDocument } from '@shared/sheet/document';
import { pieceOutlineOptions } from '@shared/sheet/outline-request';
import { profileLimits } from '@shared/sheet/preflight';
import { ExportInputError } from '../../engine/export/export';
import { exportPiece } from '../../engine/export/prepare';
import type { ExportOptions } from '../../engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../engine/export/types';
import type { OutlinePool } from '../../engine/outline/pool';
import type { Storage } from '../../storage/storage';
import { ArtItem } from '../art/art-item.entity';
import type { Sheet } from '../sheets/sheet.entity';
import { SheetProfile } from '../sheets/sheet-profile.entity';

export async function exportInput(
  dataSource: DataSource,
  storage: Storage,
  pool: OutlinePool,
  sheet: Sheet,
  doc: SheetDocument,
  options: ExportRequest,
  onPiece: (done: number, of: number) => Promise<void>,
) {
  const teamId = sheet.teamId;
  const profile = sheet.profileId ? await dataSource.getRepository(SheetProfile).findOneBy({ id: sheet.profileId }) : null;
  const arts = new Map(
    (await dataSource.getRepository(ArtItem).findBy({ teamId }))
      .filter((a) => doc.pieces.some((p) => p.artId === a.id))
      .map((a) => [a.id, a]),
  );
  const bytes = new Map<string, Buffer>();
  const pieces = [];
  for (const [i, piece] of doc.pieces.entries()) {
    const art = arts.get(piece.artId);
    if (!art) throw new ExportInputError(`Piece ${i + 1} uses art that is no longer in the team.`);
    if (!bytes.has(art.id)) bytes.set(art.id, await storage.get(art.storageKey));
    // The same request the editor's outline was made from, at the export's resolution.
    const request = pieceOutlineOptions(art, piece, { ...profileLimits(profile), dpi: options.dpi });
    pieces.push(await exportPiece(piece, art.name, request, options.bleedMm, (o) => pool.run(bytes.get(art.id)!, o)));
    await onPiece(i + 1, doc.pieces.length);
  }
  const paper = profile
    ? { paperWidthMm: profile.paperWidthMm, paperHeightMm: profile.paperHeightMm, areaXMm: profile.areaXMm, areaYMm: profile.areaYMm }
    : {
        paperWidthMm: PAPER_SIZES.letter.width,
        paperHeightMm: PAPER_SIZES.letter.height,
        areaXMm: (PAPER_SIZES.letter.width - doc.printArea.width) / 2,
        areaYMm: (PAPER_SIZES.letter.height - doc.printArea.height) / 2,
      };
  // The profile says how its cutter finds the print: the cut layer's spot colour and any printed marks.
  const resolved: ExportOptions = {
    ...options,
    spotColour: options.spotColour ?? profile?.spotColour ?? DEFAULT_EXPORT_OPTIONS.spotColour,
    marks:
      profile && profile.regMarkShape !== 'none'
        ? { shape: profile.regMarkShape, sizeMm: profile.regMarkSizeMm, offsetMm: profile.regMarkOffsetMm }
        : null,
  };
  return { pieces, paper, resolved };
}
