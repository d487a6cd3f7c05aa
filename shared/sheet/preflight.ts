import type { Ring } from '../geometry/polygon';
import { boundingBox } from '../geometry/polygon';
import type { LengthUnit } from '../units';
import { formatLength, inchToMm } from '../units';
import type { Piece, SheetDocument } from './document';
import type { PieceOutline } from './placement';
import { cutLineDistance, placeCutLine } from './placement';
import { overlaps } from '../geometry/overlap';
import { pieceProblems } from './bounds';

export type Severity = 'error' | 'warning' | 'notice';
export type FindingCode =
  | 'out-of-bounds'
  | 'outside-print-area'
  | 'overlap'
  | 'too-close'
  | 'outside-safe-margin'
  | 'too-small'
  | 'low-resolution'
  | 'narrow-neck'
  | 'personal-licence'
  | 'border-without-bleed';

/** One preflight finding: how bad, the pieces it concerns and a plain explanation. */
export type Finding = { code: FindingCode; severity: Severity; pieceIds: string[]; message: string; distanceMm?: number; dpi?: number };

/** What preflight knows of each piece's outline: the cut line, the art's resolution at that size, narrow necks found. */
export type PreflightOutline = PieceOutline & { effectiveDpi: number; narrowNecks: number };

/** Limits set on the sheet profile. Defaults are common practice (see TRADE.md). */
export type PreflightLimits = { smallestStickerMm: number; minFeatureMm: number; bridgeWidthMm: number };
export const DEFAULT_PREFLIGHT_LIMITS: PreflightLimits = { smallestStickerMm: inchToMm(0.5), minFeatureMm: 1, bridgeWidthMm: 3 };

/** A profile's limits (the defaults where a sheet has no profile). */
export const profileLimits = (profile: PreflightLimits | null | undefined): PreflightLimits =>
  profile
    ? { smallestStickerMm: profile.smallestStickerMm, minFeatureMm: profile.minFeatureMm, bridgeWidthMm: profile.bridgeWidthMm }
    : DEFAULT_PREFLIGHT_LIMITS;
/** Common practice: 1/16 in between cut lines is the hard floor; under it the blade catches the neighbour. */
const HARD_GAP_FLOOR_MM = inchToMm(1 / 16);

export type PreflightInput = {
  doc: SheetDocument;
  outlines: Map<string, PreflightOutline>;
  unit: LengthUnit;
  limits: PreflightLimits;
  forSale: boolean;
  /** The art's effective licence kind (its own or its collection's); null when none is recorded. */
  licenceOf: (piece: Piece) => string | null | undefined;
  name: (piece: Piece) => string;
  /** The export's bleed; undefined in the editor, where the bleed is not chosen yet. */
  bleedMm?: number;
};

/** The outline warnings that say a blade may tear the sticker: one rule for the editor and the server. */
export const countTearRisks = (warnings: Array<{ code: string }>) =>
  warnings.filter((w) => w.code === 'narrow-neck' || w.code === 'narrow-slot').length;

const SEVERITY_ORDER: Record<Severity, number> = { error: 0, warning: 1, notice: 2 };

/**
 * Everything that would waste a sheet of sticker paper, found before printing. Pieces without an
 * outline yet are checked for what needs no outline (licence, border colour) and skipped for the rest.
 */
export function preflight(input: PreflightInput): Finding[] {
  const { doc, outlines, unit, limits } = input;
  const len = (mm: number) => formatLength(mm, unit);
  const findings: Finding[] = [];
  const placed: Array<{ piece: Piece; ring: Ring }> = [];
  const { width, height } = doc.printArea;

  for (const [index, piece] of doc.pieces.entries()) {
    const name = input.name(piece);
    // A piece outside the physical bounds (a document saved before they were checked) is named and
    // left out of every other check: no geometry is computed for it.
    const problems = pieceProblems(doc, piece, index);
    if (problems.length > 0) {
      for (const problem of problems)
        findings.push({ code: 'out-of-bounds', severity: 'error', pieceIds: [piece.id], message: problem.message(unit, name) });
      continue;
    }
    const outline = outlines.get(piece.id);
    if (input.forSale && input.licenceOf(piece) === 'personal') {
      findings.push({
        code: 'personal-licence',
        severity: 'error',
        pieceIds: [piece.id],
        message: `${name} is licensed for personal use only, and this sheet is marked for sale. Use art with a commercial licence or unmark the sheet.`,
      });
    }
    if (piece.border > 0 && piece.borderColour !== '#ffffff' && !(input.bleedMm && input.bleedMm > 0)) {
      findings.push({
        code: 'border-without-bleed',
        severity: 'warning',
        pieceIds: [piece.id],
        message:
          input.bleedMm === undefined
            ? `${name} has a coloured border: export with a bleed (0.5 to 1.5 mm) so a small misalignment shows no white paper edge.`
            : `${name} has a coloured border but the export has no bleed: a small misalignment will show a white paper edge. Add 0.5 to 1.5 mm of bleed.`,
      });
    }
    if (!outline) continue;
    const ring = placeCutLine(piece, outline);
    placed.push({ piece, ring });
    const box = boundingBox(ring);
    if (box.x < 0 || box.y < 0 || box.x + box.width > width || box.y + box.height > height) {
      findings.push({
        code: 'outside-print-area',
        severity: 'error',
        pieceIds: [piece.id],
        message: `${name} goes past the print area: the printer may clip it and the cutter cannot reach it.`,
      });
    } else {
      const m = doc.safeMargin;
      if (box.x < m || box.y < m || box.x + box.width > width - m || box.y + box.height > height - m) {
        findings.push({
          code: 'outside-safe-margin',
          severity: 'warning',
          pieceIds: [piece.id],
          message: `${name} is inside the ${len(m)} safe margin, where the cut can drift off the print.`,
        });
      }
    }
    const across = Math.min(outline.widthMm, outline.heightMm);
    if (across < limits.smallestStickerMm) {
      findings.push({
        code: 'too-small',
        severity: 'warning',
        pieceIds: [piece.id],
        message: `${name} is ${len(across)} across, under the ${len(limits.smallestStickerMm)} smallest practical sticker: it may lift off the liner.`,
      });
    }
    const dpi = outline.effectiveDpi;
    if (dpi < 150)
      findings.push({
        code: 'low-resolution',
        severity: 'warning',
        pieceIds: [piece.id],
        dpi,
        message: `${name} prints at ${Math.round(dpi)} DPI: under 150 looks soft. Print it smaller or use a larger file.`,
      });
    else if (dpi < 300)
      findings.push({
        code: 'low-resolution',
        severity: 'notice',
        pieceIds: [piece.id],
        dpi,
        message: `${name} prints at ${Math.round(dpi)} DPI (300 is ideal for stickers).`,
      });
    if (outline.narrowNecks > 0) {
      findings.push({
        code: 'narrow-neck',
        severity: 'warning',
        pieceIds: [piece.id],
        message: `${name}'s cut line narrows below ${len(limits.minFeatureMm)} (or has a slot that narrow) in ${outline.narrowNecks === 1 ? 'one place' : `${outline.narrowNecks} places`}: the blade may tear it. Widen the border, or let Sheetsmith widen narrow parts on the art's page.`,
      });
    }
  }

  for (let i = 0; i < placed.length; i++) {
    for (let j = i + 1; j < placed.length; j++) {
      const d = cutLineDistance(placed[i].ring, placed[j].ring, doc.minGap);
      // At a gap of 0 two cut lines may touch (one cut serves both) but never cross: only the shared area tells.
      const crossing = d === 0 && (doc.minGap > 0 || overlaps(placed[i].ring, placed[j].ring));
      if (!crossing && d >= doc.minGap - 1e-6) continue;
      const pieceIds = [placed[i].piece.id, placed[j].piece.id];
      const pair = `${input.name(placed[i].piece)} and ${input.name(placed[j].piece)}`;
      if (d === 0)
        findings.push({
          code: 'overlap',
          severity: 'error',
          pieceIds,
          distanceMm: 0,
          message: `${pair} overlap: their cut lines touch or cross.`,
        });
      else
        findings.push({
          code: 'too-close',
          severity: d < HARD_GAP_FLOOR_MM ? 'error' : 'warning',
          pieceIds,
          distanceMm: d,
          message: `${pair} are ${len(d)} apart; the cutter needs ${len(doc.minGap)}.`,
        });
    }
  }
  return findings.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
}

export const countBySeverity = (findings: Finding[]) => ({
  error: findings.filter((f) => f.severity === 'error').length,
  warning: findings.filter((f) => f.severity === 'warning').length,
  notice: findings.filter((f) => f.severity === 'notice').length,
});
