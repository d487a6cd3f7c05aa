import { z } from 'zod';

export const exportRequestSchema = z.object({
  dpi: z.coerce.number({ error: 'Choose a resolution' }).int().min(150, 'At least 150 DPI').max(600, 'At most 600 DPI').default(300),
  background: z.enum(['transparent', 'white']).default('transparent'),
  bleedMm: z.coerce.number().min(0).max(5, 'At most 5 mm of bleed').default(0),
  formats: z.array(z.enum(['png', 'svg', 'combined', 'pdf', 'dxf'])).min(1, 'Pick at least one format').default(['png', 'svg', 'combined', 'pdf', 'dxf']),
  dxfUnit: z.enum(['mm', 'in']).default('mm'),
  sheetCut: z.object({ marginMm: z.number().min(0).max(50), radiusMm: z.number().min(0).max(50) }).nullable().default(null),
  spotColour: z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, 'Letters, digits, - and _ only').default('CutContour'),
  summaryPage: z.boolean().default(true),
  /** Export even though preflight found errors: the maker has read them and said so. */
  acceptErrors: z.boolean().default(false),
});
export type ExportRequest = z.infer<typeof exportRequestSchema>;

export type ExportJobView = {
  id: string;
  sheetVersion: number;
  status: 'running' | 'done' | 'failed';
  progress: number;
  step: string;
  error: string | null;
  downloadUrl: string | null;
  createdAt: string;
};
