// An auto-arrange run on the shop's server: the same request the editor's Web Workers take (the
// pieces' cut lines, the sheet's print area and rules, the time to try), bounded so one request
// cannot hold a worker for long or fill its memory.
import { z } from 'zod';
import './messages';

const point = z.object({ x: z.number().finite(), y: z.number().finite() });
const outline = z.object({
  points: z.array(point).min(3, 'A cut line needs at least three points').max(5000, 'A cut line may have at most 5000 points'),
  widthMm: z.number().positive().max(2000),
  heightMm: z.number().positive().max(2000),
});
const rotate = z.union([
  z.literal('none'),
  z.literal('90'),
  z.object({ step: z.number().min(1).max(180) }),
  z.object({ set: z.array(z.number().min(-360).max(360)).max(72) }),
]);
const key = z.string().min(1).max(400);

const MAX_ARRANGE_SECONDS = 300;

export const arrangeRunSchema = z.object({
  items: z
    .array(
      z.object({
        key,
        name: z.string().max(120).optional(),
        count: z.number().int('How many: a whole number').min(1, 'How many: at least 1').max(500, 'How many: at most 500'),
        priority: z.number().int().min(-100).max(100).optional(),
        rotate: rotate.optional(),
        outline,
      }),
    )
    .min(1, 'Choose at least one piece to arrange')
    .max(200, 'At most 200 different pieces in one run'),
  options: z.object({
    width: z.number().positive().max(2000),
    height: z.number().positive().max(2000),
    gap: z.number().min(0).max(50),
    margin: z.number().min(0).max(200),
    rotate: rotate.default('90'),
    fill: z.boolean().default(false),
    timeMs: z
      .number()
      .int()
      .min(100)
      .max(MAX_ARRANGE_SECONDS * 1000, `At most ${MAX_ARRANGE_SECONDS} s on the server`),
    seed: z
      .number()
      .int()
      .min(0)
      .max(2 ** 31)
      .default(1),
    maxSheets: z.number().int().min(1).max(50).default(20),
  }),
  locked: z
    .array(z.object({ key, x: z.number().finite(), y: z.number().finite(), rotation: z.number().min(-360).max(360), outline }))
    .max(500)
    .default([]),
});
export type ArrangeRunInput = z.infer<typeof arrangeRunSchema>;

/** What the editor sees of a run while it goes and when it is done. */
export type ArrangeRunView = {
  id: string;
  state: 'waiting' | 'running' | 'done' | 'failed';
  /** The best layout so far, while it runs. */
  progress: { placed: number; sheets: number; areaUsed: number; elapsedMs: number } | null;
  message: string | null;
};
