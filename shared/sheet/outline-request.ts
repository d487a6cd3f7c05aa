import type { OutlineOptionsInput } from '../schemas/outline';
import type { Piece } from './document';

/**
 * What an art item has saved about its outline: the art page's "Background" setting and whether the
 * maker agreed that narrow parts of the cut line may be widened.
 */
type ArtBackgroundSetting = {
  backgroundMode: 'auto' | 'keep' | 'colour';
  backgroundColour: string | null;
  backgroundTolerance: number;
  widenNecks?: boolean;
};

/** The cut limits a sheet profile sets for outlines: the smallest cuttable feature and the bridge width (mm). */
export type CutLimits = { minFeatureMm: number; bridgeWidthMm: number };

/** The art's saved background as outline options: the one place that reads the setting. */
export function artBackgroundOptions(art: ArtBackgroundSetting): Pick<OutlineOptionsInput, 'background' | 'backgroundTolerance'> {
  if (art.backgroundMode === 'keep') return { background: 'keep' };
  if (art.backgroundMode === 'colour' && art.backgroundColour)
    return { background: { colour: art.backgroundColour, tolerance: art.backgroundTolerance } };
  return { background: 'auto', backgroundTolerance: art.backgroundTolerance };
}

/** The resolution the editor's outlines (and so the preview, preflight and analysis) are made at. */
const PREVIEW_DPI = 150;

/**
 * The outline request for a piece of art placed on a sheet. The editor (through the outline
 * route), the preview, sheet analysis, export and the CLIs all build it here, so what prints is
 * what the editor showed: only the resolution differs between preview and export.
 */
export function pieceOutlineOptions(
  art: ArtBackgroundSetting,
  piece: Pick<Piece, 'width' | 'border' | 'borderColour'>,
  { dpi = PREVIEW_DPI, ...limits }: CutLimits & { dpi?: number },
): OutlineOptionsInput {
  return { ...pieceSizeOptions(piece, limits, dpi), ...artBackgroundOptions(art), widenNecks: art.widenNecks ?? false };
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));

/** The piece's part of the request, rounded as the editor's outline URLs carry it (so both agree to the bit). */
export function pieceSizeOptions(piece: Pick<Piece, 'width' | 'border' | 'borderColour'>, limits: CutLimits, dpi = PREVIEW_DPI) {
  return {
    width: round(piece.width, 2),
    border: round(piece.border, 3),
    borderColour: piece.borderColour,
    dpi,
    minFeature: round(limits.minFeatureMm, 2),
    bridgeWidth: round(Math.max(limits.bridgeWidthMm, limits.minFeatureMm), 2),
  };
}

/** Art with no saved setting (the CLIs' files): automatic removal at the engine's default tolerance. */
export const DEFAULT_ART_BACKGROUND: ArtBackgroundSetting = {
  backgroundMode: 'auto',
  backgroundColour: null,
  backgroundTolerance: 32,
  widenNecks: false,
};
