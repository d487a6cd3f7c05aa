import { z } from 'zod';
import './messages';
import { sheetDocumentSchema } from '../sheet/document';
import { idSchema } from './team';

export const PAPER_SIZES = {
  letter: { width: 215.9, height: 279.4, label: 'US Letter (8.5 × 11 in)' },
  a4: { width: 210, height: 297, label: 'A4 (210 × 297 mm)' },
} as const;

const mm = (label: string, min = 0, max = 2000) =>
  z.coerce
    .number({ error: `${label}: give a number of millimetres` })
    .min(min, `${label}: at least ${min} mm`)
    .max(max, `${label}: at most ${max} mm`);

/** Registration mark shapes: three corners of the print area get one each (the fourth stays empty, so the sheet's turn can be read). */
export const REG_MARK_SHAPES = ['none', 'square', 'dot', 'bracket'] as const;
export type RegMarkShape = (typeof REG_MARK_SHAPES)[number];
export const REG_MARK_LABELS: Record<RegMarkShape, string> = {
  none: 'None (the cutter software adds its own)',
  square: 'Filled squares',
  dot: 'Filled dots',
  bracket: 'Corner brackets',
};

/** A sheet profile: paper, the cutter's print area placed on it, safe margin and minimum gap (mm). */
export const profileInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the profile').max(80),
    paper: z.enum(['letter', 'a4', 'custom']),
    paperWidthMm: mm('Paper width', 20).optional(),
    paperHeightMm: mm('Paper height', 20).optional(),
    areaWidthMm: mm('Print area width', 10),
    areaHeightMm: mm('Print area height', 10),
    areaXMm: mm('Print area left').optional(),
    areaYMm: mm('Print area top').optional(),
    safeMarginMm: mm('Safe margin', 0, 50),
    minGapMm: mm('Minimum gap', 0, 50),
    smallestStickerMm: mm('Smallest sticker', 1, 200).optional().default(12.7),
    minFeatureMm: mm('Smallest cuttable feature', 0.1, 20).optional().default(1),
    bridgeWidthMm: mm('Bridge width', 0.5, 20).optional().default(3),
    spotColour: z
      .string()
      .trim()
      .regex(/^[A-Za-z0-9_-]{1,40}$/, 'Cut layer colour name: letters, digits, - and _ only')
      .optional()
      .default('CutContour'),
    regMarkShape: z.enum(REG_MARK_SHAPES, { error: 'Choose a registration mark shape' }).optional().default('none'),
    regMarkSizeMm: mm('Registration mark size', 1, 25).optional().default(5),
    regMarkOffsetMm: mm('Registration mark offset', 0, 25).optional().default(5),
  })
  .transform((p, ctx) => {
    const paper = p.paper === 'custom' ? { width: p.paperWidthMm, height: p.paperHeightMm } : PAPER_SIZES[p.paper];
    if (!paper.width || !paper.height) {
      ctx.addIssue({ code: 'custom', message: 'Give the paper width and height', path: ['paperWidthMm'] });
      return z.NEVER;
    }
    const x = p.areaXMm ?? (paper.width - p.areaWidthMm) / 2;
    const y = p.areaYMm ?? (paper.height - p.areaHeightMm) / 2;
    if (x < 0 || x + p.areaWidthMm > paper.width + 1e-6)
      ctx.addIssue({ code: 'custom', message: 'The print area does not fit across the paper', path: ['areaWidthMm'] });
    if (y < 0 || y + p.areaHeightMm > paper.height + 1e-6)
      ctx.addIssue({ code: 'custom', message: 'The print area does not fit down the paper', path: ['areaHeightMm'] });
    if (2 * p.safeMarginMm >= Math.min(p.areaWidthMm, p.areaHeightMm))
      ctx.addIssue({ code: 'custom', message: 'The safe margin leaves no room on the print area', path: ['safeMarginMm'] });
    if (p.bridgeWidthMm < p.minFeatureMm)
      ctx.addIssue({ code: 'custom', message: 'The bridge width cannot be below the smallest cuttable feature', path: ['bridgeWidthMm'] });
    if (p.regMarkShape !== 'none') {
      // Marks sit outside the print area's corners and must land on the paper.
      const reach = p.regMarkOffsetMm + p.regMarkSizeMm;
      const room = Math.min(x, y, paper.width - x - p.areaWidthMm, paper.height - y - p.areaHeightMm);
      if (reach > room + 1e-6)
        ctx.addIssue({
          code: 'custom',
          message: `The registration marks need ${Number(reach.toFixed(2))} mm of paper around the print area; there is ${Number(Math.max(0, room).toFixed(2))} mm. Use smaller marks, a smaller offset or a smaller print area.`,
          path: ['regMarkOffsetMm'],
        });
    }
    return {
      name: p.name,
      paper: p.paper,
      paperWidthMm: paper.width,
      paperHeightMm: paper.height,
      areaWidthMm: p.areaWidthMm,
      areaHeightMm: p.areaHeightMm,
      areaXMm: x,
      areaYMm: y,
      safeMarginMm: p.safeMarginMm,
      minGapMm: p.minGapMm,
      smallestStickerMm: p.smallestStickerMm,
      minFeatureMm: p.minFeatureMm,
      bridgeWidthMm: p.bridgeWidthMm,
      spotColour: p.spotColour,
      regMarkShape: p.regMarkShape,
      regMarkSizeMm: p.regMarkSizeMm,
      regMarkOffsetMm: p.regMarkOffsetMm,
    };
  });
export type ProfileInput = z.output<typeof profileInputSchema>;
export type ProfileView = ProfileInput & { id: string; isDefault: boolean };

export const SHEET_STATUSES = ['draft', 'ready', 'printed'] as const;
export const SHEET_STATUS_LABELS: Record<(typeof SHEET_STATUSES)[number], string> = {
  draft: 'Draft',
  ready: 'Ready to print',
  printed: 'Printed',
};

export const sheetCreateSchema = z.object({
  name: z.string().trim().min(1, 'Name the sheet').max(120, 'Use at most 120 characters'),
  profileId: idSchema.optional(),
  unit: z.enum(['in', 'mm']).optional(),
  fromTemplateId: idSchema.optional(),
});

/** A save: the version it was based on, plus whatever changed. */
export const sheetSaveSchema = z.object({
  version: z.number().int().min(1),
  name: z.string().trim().min(1, 'Name the sheet').max(120).optional(),
  unit: z.enum(['in', 'mm']).optional(),
  status: z.enum(SHEET_STATUSES).optional(),
  forSale: z.boolean().optional(),
  notes: z.string().max(4000).optional(),
  document: sheetDocumentSchema.optional(),
  areaUsed: z.number().min(0).max(1).optional(),
  thumbnail: z
    .string()
    .regex(/^data:image\/png;base64,[A-Za-z0-9+/=]+$/, 'Not a PNG data URL')
    .max(400_000)
    .optional(),
});
export type SheetSaveInput = z.infer<typeof sheetSaveSchema>;

export const sheetDuplicateSchema = z.object({
  name: z.string().trim().min(1).max(120).optional(),
  asTemplate: z.boolean().optional().default(false),
});

export const sheetListQuerySchema = z.object({
  q: z.string().trim().max(120).optional().default(''),
  status: z.enum(SHEET_STATUSES).optional(),
  ownerId: idSchema.optional(),
  templates: z.enum(['only', 'exclude']).optional().default('exclude'),
});

export const sheetParamsSchema = z.object({ teamId: idSchema, sheetId: idSchema });
export const profileParamsSchema = z.object({ teamId: idSchema, profileId: idSchema });

export type SheetSummary = {
  id: string;
  name: string;
  status: (typeof SHEET_STATUSES)[number];
  forSale: boolean;
  isTemplate: boolean;
  unit: 'in' | 'mm';
  pieceCount: number;
  areaUsed: number;
  version: number;
  owner: { id: string; name: string };
  profile: { id: string; name: string } | null;
  updatedAt: string;
  thumbnailUrl: string | null;
  /** Cost of one printed sheet from its last analysis; `current` is false when the sheet changed since. */
  cost?: { sheet: number; perSticker: number | null; currency: string; current: boolean; priced: boolean } | null;
  /** The newest export of any version: its state, and whether it matches the current version. */
  lastExport: { status: 'running' | 'done' | 'failed'; progress: number; current: boolean; downloadUrl: string | null } | null;
};

export type SheetDetail = SheetSummary & {
  notes: string;
  document: z.infer<typeof sheetDocumentSchema>;
  artNames: Record<string, string>;
  /** Each art item's effective licence kind (its own or its collection's), for preflight. */
  artLicences: Record<string, string | null>;
  /** The profile's preflight limits (mm). */
  limits: { smallestStickerMm: number; minFeatureMm: number; bridgeWidthMm: number };
  /** How the profile's cutter finds the print: the PDF cut layer's spot colour and any printed registration marks. */
  printing: { spotColour: string; marks: { shape: Exclude<RegMarkShape, 'none'>; sizeMm: number; offsetMm: number } | null };
};
