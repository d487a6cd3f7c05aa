import type { Piece } from '@shared/sheet/document';
import type { OutlineOptionsInput } from '@shared/schemas/outline';
import type { OutlineResult } from '../outline/outline';
import type { ExportPiece } from './types';

/**
 * The cut line and raster of one piece for export, from any outline source (the engine directly,
 * or the server's cached pool), with the options pieceOutlineOptions() gives. With bleed, the raster comes from an outline with the border grown
 * by the bleed, while the cut line stays on the border's edge.
 */
export async function exportPiece(
  piece: Piece,
  name: string,
  base: OutlineOptionsInput,
  bleedMm: number,
  compute: (options: OutlineOptionsInput) => Promise<OutlineResult>,
): Promise<ExportPiece> {
  const cut = (await compute(base)).pieces[0];
  const raster = bleedMm > 0 ? (await compute({ ...base, border: piece.border + bleedMm })).pieces[0] : cut;
  return {
    piece,
    name,
    cutLine: { points: cut.cutLine.points, widthMm: cut.widthMm, heightMm: cut.heightMm },
    raster: { png: raster.png, widthMm: raster.widthMm, heightMm: raster.heightMm },
  };
}
