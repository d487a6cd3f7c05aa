import { z } from 'zod';
import './messages';
import { parseLength, inchToMm } from '../units';
import type { Box, Point } from '../geometry/polygon';

/** A length given as "2in", "3mm", "0.5\"" or a bare number of millimetres. */
const lengthSchema = (label: string) =>
  z.union([z.number(), z.string()]).transform((value, ctx) => {
    const mm = typeof value === 'number' ? value : parseLength(value, 'mm');
    if (mm === null || !Number.isFinite(mm)) {
      ctx.addIssue({ code: 'custom', message: `${label}: give a length like 2in or 50mm` });
      return z.NEVER;
    }
    return mm as number;
  });

const hexColour = z
  .string()
  .trim()
  .regex(/^#?[0-9a-fA-F]{6}$/, 'Give a colour like #ffffff')
  .transform((value) => `#${value.replace('#', '').toLowerCase()}`);

/**
 * Each removal mode's own default tolerance (distance in RGB). Automatic removal guesses the colour
 * from the edge, so it allows more spread; a picked colour is exact, so it starts tighter. Switching
 * mode starts again from the new mode's default: a tolerance tuned for one never carries over.
 */
export const DEFAULT_TOLERANCE = { auto: 32, colour: 24 } as const;
/** Alpha (0–255) at or above which a pixel counts as art unless asked otherwise. */
export const DEFAULT_ALPHA_THRESHOLD = 48;

const backgroundSchema = z
  .union([
    z.literal('auto'),
    z.literal('keep'),
    z.object({ colour: hexColour, tolerance: z.coerce.number().min(0).max(255).default(DEFAULT_TOLERANCE.colour) }),
  ])
  .default('auto');

const DEFAULT_BORDER_MM = inchToMm(0.125);

/**
 * Options of the outline engine. Lengths are millimetres after parsing. Exactly one of width or
 * height sets the printed size of the art's visible part (transparent margins trimmed).
 */
export const outlineOptionsSchema = z
  .object({
    width: lengthSchema('Printed width').pipe(z.number().min(2, 'At least 2 mm').max(1000, 'At most 1 m')).optional(),
    height: lengthSchema('Printed height').pipe(z.number().min(2, 'At least 2 mm').max(1000, 'At most 1 m')).optional(),
    border: lengthSchema('Border').pipe(z.number().min(0).max(50, 'At most 50 mm')).default(DEFAULT_BORDER_MM),
    borderColour: hexColour.default('#ffffff'),
    dpi: z.coerce.number().int().min(72, 'At least 72 DPI').max(1200, 'At most 1200 DPI').default(300),
    /** Alpha (0–255) at or above which a pixel counts as art. Soft watercolour edges fade below it. */
    alphaThreshold: z.coerce.number().int().min(1).max(255).default(DEFAULT_ALPHA_THRESHOLD),
    background: backgroundSchema,
    /** Tolerance (0–255, distance in RGB) for `auto` background removal. */
    backgroundTolerance: z.coerce.number().min(0).max(255).default(DEFAULT_TOLERANCE.auto),
    /** Largest share of the art (0–1) background removal may take before it warns (the art-taken check). */
    removalGuard: z.coerce.number().min(0).max(1).default(0.02),
    /** Bits of art smaller than this (mm²) are dropped as specks. */
    minSpeckArea: z.coerce.number().min(0).max(10_000).default(0.5),
    islands: z.enum(['join', 'split']).default('join'),
    /** Largest distance (mm) simplification may move the cut line. */
    smoothing: lengthSchema('Smoothing').pipe(z.number().min(0).max(1)).default(0.05),
    /** Narrowest part of a cut line that still cuts cleanly (common practice: about 1 mm). */
    minFeature: lengthSchema('Smallest feature').pipe(z.number().min(0).max(20)).default(1),
    /** Width of the cut shape where it joins separate parts of the art (never below minFeature). */
    bridgeWidth: lengthSchema('Bridge width').pipe(z.number().min(0.5).max(20)).default(3),
    /** Also widen necks inside one part of the art to the bridge width (the maker agreed to change the shape). */
    widenNecks: z.union([z.boolean(), z.enum(['true', 'false', '1', '0']).transform((v) => v === 'true' || v === '1')]).default(false),
  })
  .refine((o) => (o.width === undefined) !== (o.height === undefined), {
    message: 'Give the printed width or the printed height (one of them)',
    path: ['width'],
  });

export type OutlineOptionsInput = z.input<typeof outlineOptionsSchema>;
export type OutlineOptions = z.output<typeof outlineOptionsSchema>;

export type OutlineWarning = {
  code:
    | 'low-resolution'
    | 'very-low-resolution'
    | 'narrow-neck'
    | 'narrow-slot'
    | 'necks-widened'
    | 'specks-dropped'
    | 'islands-joined'
    | 'background-removed'
    | 'background-took-art'
    | 'no-flat-background';
  severity: 'notice' | 'warning';
  message: string;
  /** Where on the finished sticker (mm from its top-left corner), for warnings about a place. */
  at?: { xMm: number; yMm: number };
};

/**
 * One finished sticker. Its frame is the sticker's bounding box (art plus border on every side):
 * millimetres, origin at the frame's top-left, x to the right, y down. The cut line is one simple
 * closed polygon in that frame, running clockwise on screen (positive shoelace area with y down),
 * first point not repeated. The piece's PNG covers exactly the frame.
 */
export type OutlinePieceData = {
  cutLine: { points: Point[]; svgPath: string };
  areaMm2: number;
  perimeterMm: number;
  /** Bounds of the cut line in the frame (mm). */
  bbox: Box;
  /** Frame size (mm) and its place in the whole art's frame (the join frame), in mm. */
  widthMm: number;
  heightMm: number;
  offsetMm: Point;
  pixelWidth: number;
  pixelHeight: number;
};

export type OutlineData<P extends OutlinePieceData = OutlinePieceData> = {
  pieces: P[];
  art: {
    format: string;
    sourceWidthPx: number;
    sourceHeightPx: number;
    /** The visible part of the source (transparent margins and specks trimmed), in source pixels. */
    visible: Box;
    printedWidthMm: number;
    printedHeightMm: number;
    hadTransparency: boolean;
  };
  /** Source pixels per inch of the art at its printed size. */
  effectiveDpi: number;
  dpi: number;
  borderMm: number;
  warnings: OutlineWarning[];
};

/** What `GET /api/teams/:team/art/:art/outline` answers: the outline, and where each piece's PNG is. */
export type OutlineResponse = OutlineData<OutlinePieceData & { index: number; pngUrl: string }> & {
  key: string;
  cached: boolean;
  artId: string;
};

const HEX = /^#?[0-9a-fA-F]{6}$/;

/**
 * Outline options as URL query strings: `background` is auto, keep or a colour such as #ffffff
 * (then `backgroundTolerance` is its tolerance).
 */
export const outlineQuerySchema = z.preprocess((raw) => {
  const query = { ...(raw as Record<string, unknown>) };
  if (typeof query.background === 'string' && HEX.test(query.background)) {
    query.background = { colour: query.background, tolerance: query.backgroundTolerance ?? DEFAULT_TOLERANCE.colour };
  }
  return query;
}, outlineOptionsSchema);

/** The removal preview's query: the background as the outline query gives it (auto, keep or a colour) and its tolerance. */
export const removalPreviewQuerySchema = z.object({
  background: z.union([z.enum(['auto', 'keep']), z.string().regex(HEX, 'Give a colour like #ffffff')]).default('auto'),
  backgroundTolerance: z.coerce
    .number({ error: 'Give the tolerance as a number from 0 to 255' })
    .min(0, 'The tolerance is at least 0')
    .max(255, 'The tolerance is at most 255')
    .optional(),
});
export type RemovalPreviewQuery = z.output<typeof removalPreviewQuerySchema>;
