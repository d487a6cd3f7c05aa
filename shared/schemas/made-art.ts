import { z } from 'zod';
import './messages';

/** Fonts shipped with the app (@fontsource, SIL Open Font License 1.1), by names of our own. */
export const STICKER_FONTS = {
  rounded: { label: 'Rounded', family: 'Nunito', file: '@fontsource/nunito/files/nunito-latin-800-normal.woff' },
  handwritten: { label: 'Handwritten', family: 'Caveat', file: '@fontsource/caveat/files/caveat-latin-400-normal.woff' },
  chunky: { label: 'Chunky', family: 'Lilita One', file: '@fontsource/lilita-one/files/lilita-one-latin-400-normal.woff' },
} as const;
export type StickerFont = keyof typeof STICKER_FONTS;
export const SHAPES = { circle: 'Circle', rounded: 'Rounded rectangle', label: 'Label (round ends)' } as const;

const hex = (label: string) => z.string().regex(/^#[0-9a-f]{6}$/i, `${label}: give a colour like #2a9d8f`);
const mm = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label}: give a size` })
    .min(min, `${label}: at least ${min} mm`)
    .max(max, `${label}: at most ${max} mm`);

/** A sticker made from words, a shape, or a shape with words inside; drawn by the server as vector art. */
export const madeArtSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the sticker').max(120, 'Use at most 120 characters'),
    kind: z.enum(['text', 'shape']),
    text: z
      .string()
      .max(300, 'Use at most 300 characters')
      .refine((t) => t.split('\n').length <= 6, 'At most 6 lines')
      .default(''),
    font: z.enum(Object.keys(STICKER_FONTS) as [StickerFont, ...StickerFont[]]).default('rounded'),
    /** Height of a capital letter's em square, in mm: the type size on the sticker. */
    letterMm: mm('Letter size', 2, 150).default(10),
    textColour: hex('Text colour').default('#264653'),
    align: z.enum(['left', 'centre', 'right']).default('centre'),
    shape: z.enum(['circle', 'rounded', 'label']).default('rounded'),
    shapeWidthMm: mm('Shape width', 5, 300).default(50),
    shapeHeightMm: mm('Shape height', 5, 300).default(25),
    fill: hex('Fill').default('#e9c46a'),
    keywords: z.array(z.string().trim().max(60)).max(20).default([]),
    collectionId: z
      .string()
      .regex(/^\d{1,18}$/)
      .optional(),
  })
  .refine((a) => a.kind === 'shape' || a.text.trim() !== '', { message: 'Type the words for the sticker', path: ['text'] });
export type MadeArt = z.infer<typeof madeArtSchema>;

/** The largest side of a made sticker's art (mm). */
export const MADE_ART_MAX_MM = 300;
