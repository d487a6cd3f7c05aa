import { z } from 'zod';
import './messages';
import type { Coverage } from '../production/coverage';
import type { CostBreakdown } from '../production/cost';
import type { Finding } from '../sheet/preflight';
import { PAPER_SIZES } from './sheets';
import { idSchema } from './team';
import { ORDER_CURRENCIES } from '../orders/money';

const money = (label: string, max = 100_000) =>
  z.coerce
    .number({ error: `${label}: give an amount` })
    .min(0, `${label}: not below 0`)
    .max(max, `${label}: at most ${max}`);
const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Give a date like 2026-03-14');

export const shopSettingsSchema = z.object({
  currency: z.string().trim().min(1, 'Give a currency sign').max(4),
  labourRatePerHour: money('Labour rate', 10_000),
  markupPercent: z.coerce.number({ error: 'Markup: give a percentage' }).min(0, 'Markup: not below 0').max(10_000),
  /** Misprints and spoiled sheets, as a share of the materials (stock, ink, blade) of every sheet. */
  wastePercent: z.coerce
    .number({ error: 'Waste allowance: give a percentage' })
    .min(0, 'Waste allowance: not below 0')
    .max(100, 'Waste allowance: at most 100 %')
    .default(0),
  /** The team's usual stock, printer and cutter: sheets with no choice of their own are costed on them. */
  defaultStockId: z.preprocess((v) => (v === '' ? null : v), idSchema.nullable()).default(null),
  defaultPrinterId: z.preprocess((v) => (v === '' ? null : v), idSchema.nullable()).default(null),
  defaultCutterId: z.preprocess((v) => (v === '' ? null : v), idSchema.nullable()).default(null),
  /** What buyers pay in (ISO 4217); kept as it is when not sent. */
  currencyCode: z.enum(ORDER_CURRENCIES, { error: `Pick a currency: ${ORDER_CURRENCIES.join(', ')}` }).optional(),
  /** Whether viewers see prices on orders; kept as it is when not sent. */
  viewersSeePrices: z.boolean().optional(),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;

export const STOCK_FINISHES = ['glossy', 'matte', 'clear', 'vinyl', 'other'] as const;
export const FINISH_LABELS: Record<(typeof STOCK_FINISHES)[number], string> = {
  glossy: 'Glossy',
  matte: 'Matte',
  clear: 'Clear',
  vinyl: 'Vinyl',
  other: 'Other',
};

/** What the printer was set to when the stock printed well; free text, in the maker's words. */
export const printerSettingsSchema = z.object({
  paperSetting: text(120).default(''),
  quality: text(120).default(''),
  colour: text(120).default(''),
  other: text(500).default(''),
});
/** What the cutter was set to: the material setting as the maker's machine names it, pressure, passes, blade. */
export const cutterSettingsSchema = z.object({
  material: text(120).default(''),
  pressure: text(40).default(''),
  passes: z.coerce.number().int().min(1, 'At least 1 pass').max(10, 'At most 10 passes').default(1),
  blade: text(120).default(''),
});
export type PrinterSettings = z.infer<typeof printerSettingsSchema>;
export type CutterSettings = z.infer<typeof cutterSettingsSchema>;

export const stockInputSchema = z
  .object({
    name: text(120).min(1, 'Name the stock'),
    finish: z.enum(STOCK_FINISHES, { error: 'Pick a finish' }),
    paper: z.enum(['letter', 'a4', 'custom']),
    paperWidthMm: z.coerce.number().min(20, 'Paper width: at least 20 mm (0.79 in)').max(2000, 'Paper width: at most 2000 mm').optional(),
    paperHeightMm: z.coerce
      .number()
      .min(20, 'Paper height: at least 20 mm (0.79 in)')
      .max(2000, 'Paper height: at most 2000 mm')
      .optional(),
    packPrice: money('Pack price'),
    sheetsPerPack: z.coerce
      .number({ error: 'Sheets per pack: give a number' })
      .int('Sheets per pack: a whole number')
      .min(1, 'At least 1 sheet per pack')
      .max(100_000),
    onHand: z.coerce.number().int('Sheets on hand: a whole number').min(0, 'Sheets on hand: not below 0').max(1_000_000).default(0),
    /** Say the stock is running low at this many sheets on hand or fewer; empty for never. */
    lowAt: z
      .preprocess(
        (v) => (v === '' ? null : v),
        z.coerce.number().int('Running low at: a whole number of sheets').min(0, 'Running low at: not below 0').max(1_000_000).nullable(),
      )
      .default(null),
    printerSettings: printerSettingsSchema.default({ paperSetting: '', quality: '', colour: '', other: '' }),
    cutterSettings: cutterSettingsSchema.default({ material: '', pressure: '', passes: 1, blade: '' }),
    rating: z.coerce.number().int().min(1, 'Rate 1 to 5').max(5, 'Rate 1 to 5').nullable().default(null),
    foodSafe: z.boolean().default(false),
    skinSafe: z.boolean().default(false),
    notes: text(2000).default(''),
  })
  .transform((s, ctx) => {
    const size = s.paper === 'custom' ? { width: s.paperWidthMm, height: s.paperHeightMm } : PAPER_SIZES[s.paper];
    if (!size.width || !size.height) {
      ctx.addIssue({ code: 'custom', message: 'Give the paper width and height', path: ['paperWidthMm'] });
      return z.NEVER;
    }
    return { ...s, paperWidthMm: size.width, paperHeightMm: size.height };
  });
export type StockInput = z.output<typeof stockInputSchema>;

/** A count of sheets on hand: a delivery (+), a count correction or sheets used outside a run. */
export const stockAdjustSchema = z.object({
  change: z.coerce
    .number()
    .int('A whole number of sheets')
    .min(-100_000)
    .max(100_000)
    .refine((n) => n !== 0, 'Give a change other than 0'),
  confirmNegative: z.boolean().default(false),
});

export type StockView = Omit<StockInput, 'paperWidthMm' | 'paperHeightMm'> & {
  id: string;
  paperWidthMm: number;
  paperHeightMm: number;
  costPerSheet: number;
  archived: boolean;
  /** On hand at or below its running-low mark. */
  low: boolean;
};

export const machineInputSchema = z
  .object({
    kind: z.enum(['printer', 'cutter']),
    name: text(120).min(1, 'Name the machine'),
    notes: text(2000).default(''),
    /** Printers: ink for one fully covered page, from the cartridge price and rated yield. */
    inkFullPage: money('Ink for a fully covered page', 1000).nullable().default(null),
  })
  .refine((m) => m.kind === 'cutter' || m.inkFullPage !== null, {
    message: 'Give what ink for a fully covered page costs',
    path: ['inkFullPage'],
  });

export const bladeFitSchema = z.object({
  label: text(120).min(1, 'Name the blade (type, holder, where it was bought)'),
  fittedOn: day,
  lifeM: z.coerce.number({ error: 'Replace at: give metres' }).min(1, 'Replace at: at least 1 m').max(1_000_000),
  price: money('Blade price', 10_000).default(0),
  /** Replace by this date however little it has cut (blades dull and chip with age too); empty for no date. */
  replaceBy: z.preprocess((v) => (v === '' ? null : v), day.nullable()).default(null),
  note: text(300).default(''),
});
export type BladeFit = z.infer<typeof bladeFitSchema>;

/** Near its replacement length at 90 % (a margin of our own choosing), due at 100 %. */
export const BLADE_NEAR_SHARE = 0.9;
/** Near its replace-by date this many days before it (our own margin). */
export const BLADE_NEAR_DAYS = 7;
export type BladeView = {
  id: string;
  label: string;
  fittedOn: string;
  removedOn: string | null;
  cutLengthM: number;
  lifeM: number;
  price: number;
  note: string;
  replaceBy: string | null;
  wear: 'ok' | 'near' | 'due';
  /** Why it is near or due, in a maker's words ("cut 96 of 100 m", "replace by 2026-12-01"). */
  wearReason: string | null;
};
export type MachineView = {
  id: string;
  kind: 'printer' | 'cutter';
  name: string;
  notes: string;
  inkFullPage: number | null;
  blade: BladeView | null;
  blades: BladeView[];
};

export const RUN_RESULTS = ['good', 'misaligned', 'tore', 'other'] as const;
export const RUN_RESULT_LABELS: Record<(typeof RUN_RESULTS)[number], string> = {
  good: 'Good',
  misaligned: 'Misaligned',
  tore: 'Tore',
  other: 'Other problem',
};

export const printRunInputSchema = z
  .object({
    sheetId: z.string({ error: 'Choose the sheet you printed' }).regex(/^\d{1,18}$/, 'Choose the sheet you printed'),
    copies: z.coerce
      .number({ error: 'Copies: give a number' })
      .int('Copies: a whole number')
      .min(1, 'At least 1 copy')
      .max(1000, 'At most 1000 copies'),
    wasted: z.coerce
      .number({ error: 'Wasted: give a number of sheets' })
      .int('Wasted: a whole number of sheets')
      .min(0, 'Wasted: not below 0')
      .max(1000, 'Wasted: at most 1000 sheets')
      .optional(),
    stockId: z.string({ error: 'Choose the stock you printed on' }).regex(/^\d{1,18}$/, 'Choose the stock you printed on'),
    printerId: idSchema.nullable().default(null),
    cutterId: idSchema.nullable().default(null),
    printerSettings: printerSettingsSchema.optional(),
    cutterSettings: cutterSettingsSchema.optional(),
    result: z.enum(RUN_RESULTS, { error: 'Pick how the run came out' }),
    notes: text(2000).default(''),
    printedOn: day.optional(),
    /** Take the sheets even when stock on hand goes below zero (a count was off). */
    confirmNegativeStock: z.boolean().default(false),
    /** The buyer's order this run was printed for, if any. */
    orderId: idSchema.nullable().default(null),
  })
  .refine((r) => r.wasted === undefined || r.wasted <= r.copies, { message: 'Wasted sheets cannot exceed copies', path: ['wasted'] });
export type PrintRunInput = z.infer<typeof printRunInputSchema>;

export const runListQuerySchema = z.object({
  from: day.optional(),
  to: day.optional(),
  result: z.enum(RUN_RESULTS).optional(),
  stockId: idSchema.optional(),
  cutterId: idSchema.optional(),
  sheetId: idSchema.optional(),
  orderId: idSchema.optional(),
});

export type PrintRunView = {
  id: string;
  sheet: { id: string | null; name: string; version: number };
  copies: number;
  wasted: number;
  stock: { id: string; name: string } | null;
  printer: { id: string; name: string } | null;
  cutter: { id: string; name: string } | null;
  blade: { id: string; label: string } | null;
  printerSettings: PrinterSettings;
  cutterSettings: CutterSettings;
  result: (typeof RUN_RESULTS)[number];
  notes: string;
  photoUrl: string | null;
  cutLengthM: number;
  printedOn: string;
  by: string;
  orderId: string | null;
};

export const costingInputSchema = z.object({
  stockId: idSchema.nullable(),
  printerId: idSchema.nullable(),
  cutterId: idSchema.nullable(),
  labourMinutes: z.coerce.number().min(0, 'Labour: not below 0').max(600, 'Labour: at most 600 minutes'),
});

/** What the server found on a sheet version: preflight findings and the figures cost is built from. */
export type SheetAnalysis = {
  version: number;
  pieces: number;
  cutLengthMm: number;
  coverage: Coverage;
  printAreaShare: number;
  findings: Finding[];
};

export type SheetCostView = {
  analysis: SheetAnalysis;
  costing: z.infer<typeof costingInputSchema>;
  inputs: {
    stock: { name: string; packPrice: number; sheetsPerPack: number; perSheet: number } | null;
    printer: { name: string; inkFullPage: number } | null;
    blade: { label: string; price: number; lifeM: number } | null;
    labourRatePerHour: number;
    markupPercent: number;
    wastePercent: number;
    currency: string;
  };
  cost: CostBreakdown;
  missing: string[];
  /** Costed on a stock: without one there is no price to show. */
  priced: boolean;
  /** Where the choices came from when the sheet has none of its own: its last run, the team's usual ones, or the team's last run. */
  defaultsFrom: 'sheet-run' | 'team-default' | 'team-run' | null;
};
