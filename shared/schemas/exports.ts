import { z } from 'zod';
import './messages';

export const exportRequestSchema = z.object({
  dpi: z.coerce.number({ error: 'Choose a resolution' }).int().min(150, 'At least 150 DPI').max(600, 'At most 600 DPI').default(300),
  background: z.enum(['transparent', 'white']).default('transparent'),
  bleedMm: z.coerce.number().min(0).max(5, 'At most 5 mm of bleed').default(0),
  formats: z
    .array(z.enum(['png', 'svg', 'combined', 'pdf', 'dxf']))
    .min(1, 'Pick at least one format')
    .default(['png', 'svg', 'combined', 'pdf', 'dxf']),
  dxfUnit: z.enum(['mm', 'in']).default('mm'),
  sheetCut: z
    .object({ marginMm: z.number().min(0).max(50), radiusMm: z.number().min(0).max(50) })
    .nullable()
    .default(null),
  /** The PDF cut layer's spot colour; without it the sheet profile's. */
  spotColour: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,40}$/, 'Cut layer colour name: letters, digits, - and _ only')
    .optional(),
  /** Put the profile's registration marks in the cut files too (they always print when the profile has them). */
  marksInCutFile: z.boolean().default(false),
  /** The summary as extra PDF pages; off by default (it is always a file of its own). */
  summaryPage: z.boolean().default(false),
  /** A 1 in scale bar in the PDF's margin. */
  checkBar: z.boolean().default(true),
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
  /** Each file of the finished bundle on its own. */
  files: ExportFileView[];
  createdAt: string;
};

export type ExportFileView = { name: string; label: string; size: number; url: string };

/** What each exported file is, from its name's ending (longest ending first). */
export function exportFileLabel(name: string): string {
  const endings: Array<[string, string]> = [
    ['-print-and-cut.svg', 'Print and cut in one (SVG)'],
    ['-print.png', 'Print image (PNG) for the cutter software'],
    ['-cut.svg', 'Cut lines (SVG)'],
    ['-cut.dxf', 'Cut lines (DXF)'],
    ['-summary.pdf', 'Summary (PDF, not for printing on sticker paper)'],
    ['-settings.txt', 'Settings (text)'],
    ['.pdf', 'Print page (PDF)'],
  ];
  return endings.find(([end]) => name.endsWith(end))?.[1] ?? name;
}
