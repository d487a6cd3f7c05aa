import { z } from 'zod';
import './messages';
import { DEFAULT_TOLERANCE } from './outline';
import { idSchema } from './team';

export const LICENCE_KINDS = ['personal', 'commercial', 'commercial_limited'] as const;
export type LicenceKind = (typeof LICENCE_KINDS)[number];
export const LICENCE_LABELS: Record<LicenceKind, string> = {
  personal: 'Personal use only',
  commercial: 'Commercial use',
  commercial_limited: 'Commercial, limited units',
};

export const licenceSchema = z
  .object({
    kind: z.enum(LICENCE_KINDS, { error: 'Pick a licence kind' }),
    source: z.string().trim().max(300, 'Use at most 300 characters').optional().default(''),
    notes: z.string().trim().max(4000, 'Use at most 4000 characters').optional().default(''),
    unitLimit: z.coerce
      .number({ error: 'Units allowed: give a whole number, like 500' })
      .int('Units allowed: a whole number, like 500')
      .min(1, 'Units allowed: at least 1')
      .max(10_000_000, 'Units allowed: at most 10,000,000')
      .nullable()
      .optional(),
  })
  .refine((l) => l.kind !== 'commercial_limited' || (l.unitLimit ?? null) !== null, {
    message: 'Give the number of units the licence allows',
    path: ['unitLimit'],
  });
export type LicenceInput = z.infer<typeof licenceSchema>;

const keywordList = z
  .union([z.string(), z.array(z.string())])
  .transform((value) => (Array.isArray(value) ? value : value.split(',')).map((k) => k.trim()).filter(Boolean))
  .pipe(z.array(z.string().max(60, 'Keep each keyword under 60 characters')).max(50, 'At most 50 keywords'));

export const uploadFieldsSchema = z.object({
  keywords: keywordList.optional().default([]),
  collectionId: idSchema.optional().or(z.literal('').transform(() => undefined)),
});

export const artListQuerySchema = z.object({
  q: z.string().trim().max(200).optional().default(''),
  collectionId: z.union([idSchema, z.literal('none')]).optional(),
  licence: z.union([z.enum(LICENCE_KINDS), z.literal('none')]).optional(),
  transparency: z.enum(['yes', 'no']).optional(),
  uploadedBy: idSchema.optional(),
  from: z.iso.date({ error: 'Use a date like 2026-01-31' }).optional(),
  to: z.iso.date({ error: 'Use a date like 2026-01-31' }).optional(),
  sort: z.enum(['relevance', 'created', 'name', 'size', 'pixels']).optional().default('relevance'),
  dir: z.enum(['asc', 'desc']).optional().default('desc'),
  page: z.coerce.number().int().min(1).optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(100).optional().default(24),
});
export type ArtListQuery = z.infer<typeof artListQuerySchema>;
/** A page of search results; `suggestion` is the query with each unknown word replaced by the nearest known one. */
export type ArtPage = { items: ArtView[]; total: number; page: number; pageSize: number; suggestion: string | null };

/** A saved background setting; without a tolerance the mode's own default applies (none carries over from another mode). */
const backgroundSettingSchema = z
  .object({
    mode: z.enum(['auto', 'keep', 'colour']),
    colour: z
      .string()
      .regex(/^#[0-9a-f]{6}$/i, 'Give a colour like #ffffff')
      .nullable()
      .optional(),
    tolerance: z.coerce
      .number({ error: 'Give the tolerance as a number from 0 to 255' })
      .int()
      .min(0, 'The tolerance is at least 0')
      .max(255, 'The tolerance is at most 255')
      .optional(),
  })
  .refine((b) => b.mode !== 'colour' || Boolean(b.colour), { message: 'Pick the colour to remove', path: ['colour'] })
  .transform((b) => ({ ...b, tolerance: b.tolerance ?? (b.mode === 'colour' ? DEFAULT_TOLERANCE.colour : DEFAULT_TOLERANCE.auto) }));

export const artUpdateSchema = z.object({
  name: z.string().trim().min(1, 'Give the art a name').max(200).optional(),
  keywords: keywordList.optional(),
  /** Every collection the art is in (replaces the set); its licence does not change with them. */
  collectionIds: z.array(idSchema).max(100).optional(),
  licence: licenceSchema.nullable().optional(),
  background: backgroundSettingSchema.optional(),
  /** The maker agrees that narrow parts of the cut line may be widened to the profile's bridge width. */
  widenNecks: z.boolean({ error: 'Say yes or no to widening narrow parts' }).optional(),
});
export type ArtUpdateInput = z.infer<typeof artUpdateSchema>;

export const bulkActionSchema = z.discriminatedUnion('action', [
  z.object({
    action: z.literal('addKeyword'),
    ids: z.array(idSchema).min(1).max(500),
    keyword: z.string().trim().min(1, 'Type a keyword').max(60),
  }),
  z.object({
    action: z.literal('removeKeyword'),
    ids: z.array(idSchema).min(1).max(500),
    keyword: z.string().trim().min(1, 'Type a keyword').max(60),
  }),
  z.object({ action: z.literal('move'), ids: z.array(idSchema).min(1).max(500), collectionId: idSchema.nullable() }),
  z.object({ action: z.literal('delete'), ids: z.array(idSchema).min(1).max(500), confirm: z.boolean().optional() }),
]);
export type BulkAction = z.infer<typeof bulkActionSchema>;

export const collectionCreateSchema = z.object({
  name: z.string().trim().min(1, 'Name the collection').max(120, 'Use at most 120 characters'),
  membersCanAdd: z.boolean().optional().default(true),
  licence: licenceSchema.nullable().optional(),
});
export const collectionUpdateSchema = z.object({
  name: z.string().trim().min(1, 'Name the collection').max(120, 'Use at most 120 characters').optional(),
  membersCanAdd: z.boolean().optional(),
  archived: z.boolean().optional(),
  licence: licenceSchema.nullable().optional(),
});
export const collectionOrderSchema = z.object({ ids: z.array(idSchema).min(1).max(1000) });

export const artParamsSchema = z.object({ teamId: idSchema, artId: idSchema });
export const collectionParamsSchema = z.object({ teamId: idSchema, collectionId: idSchema });

export type LicenceView = {
  kind: LicenceKind;
  source: string;
  notes: string;
  unitLimit: number | null;
  proofName: string | null;
  proofUrl: string | null;
  inheritedFrom: { collectionId: string; name: string } | null;
};

export type ArtView = {
  id: string;
  name: string;
  format: string;
  sizeBytes: number;
  widthPx: number;
  heightPx: number;
  hasTransparency: boolean;
  /** The largest printed size (mm) at 300 and at 150 DPI. */
  largestPrint: { at300: { widthMm: number; heightMm: number }; at150: { widthMm: number; heightMm: number } };
  keywords: string[];
  /** The collections the art is in, in the team's order. */
  collections: Array<{ id: string; name: string }>;
  licence: LicenceView | null;
  background: { mode: 'auto' | 'keep' | 'colour'; colour: string | null; tolerance: number };
  widenNecks: boolean;
  uploadedBy: { id: string; name: string };
  createdAt: string;
  updatedAt: string;
  thumbnailUrl: string;
  fileUrl: string;
  /** The vector original the art was drawn from (cleaned), when it came as SVG. */
  source: { format: 'svg'; url: string } | null;
};

export type CollectionView = {
  id: string;
  name: string;
  position: number;
  membersCanAdd: boolean;
  archived: boolean;
  artCount: number;
  licence: Omit<LicenceView, 'inheritedFrom'> | null;
};

export type UploadResult = {
  file: string;
  status: 'stored' | 'duplicate' | 'rejected' | 'skipped';
  reason?: string;
  item?: ArtView;
  suggestedKeywords?: string[];
};
