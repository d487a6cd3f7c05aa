// npm run export -- <sheet.json> --out <dir> [--dpi 300] [--formats png,svg,combined,pdf,dxf]
//   [--background transparent|white] [--bleed 0mm] [--paper letter|a4] [--dxf-unit mm|in] [--name "…"]
// Exports a sheet saved as JSON by the arrange CLI (the sheet document plus its art files); writes
// every file and the bundle zip. No database needed.
import { DEFAULT_ART_BACKGROUND, pieceOutlineOptions } from '../shared/sheet/outline-request';
import { DEFAULT_PREFLIGHT_LIMITS } from '../shared/sheet/preflight';
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { fail } from './cli';
import { z } from 'zod';
import { sheetDocumentSchema } from '../shared/sheet/document';
import { PAPER_SIZES } from '../shared/schemas/sheets';
import { parseLength } from '../shared/units';
import { ExportInputError, exportSheet } from '../server/engine/export/export';
import { exportPiece } from '../server/engine/export/prepare';
import type { ExportFormat } from '../server/engine/export/types';
import { DEFAULT_EXPORT_OPTIONS, EXPORT_FORMATS } from '../server/engine/export/types';
import { OutlineInputError } from '../server/engine/outline/errors';
import { outline } from '../server/engine/outline/outline';

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    out: { type: 'string' },
    dpi: { type: 'string', default: '300' },
    formats: { type: 'string', default: EXPORT_FORMATS.join(',') },
    background: { type: 'string', default: 'transparent' },
    bleed: { type: 'string', default: '0mm' },
    paper: { type: 'string', default: 'letter' },
    'dxf-unit': { type: 'string', default: 'mm' },
    name: { type: 'string' },
  },
});
if (!values.out || positionals.length !== 1)
  fail('usage: npm run export -- <sheet.json> --out <dir> [--dpi 300] [--formats png,svg,combined,pdf,dxf]');
const file = positionals[0];
const saved = z
  .object({ document: sheetDocumentSchema, art: z.record(z.string(), z.string()) })
  .safeParse(JSON.parse(await readFile(file, 'utf8').catch(() => fail(`${file}: no such file`))));
if (!saved.success)
  fail(`${file}: not a sheet saved by the arrange CLI (${saved.error.issues[0]?.path.join('.')}: ${saved.error.issues[0]?.message})`);
const { document, art } = saved.data!;
const formats = values.formats!.split(',').map((f) => f.trim()) as ExportFormat[];
const unknown = formats.filter((f) => !EXPORT_FORMATS.includes(f));
if (unknown.length) fail(`--formats: unknown ${unknown.join(', ')} (choose from ${EXPORT_FORMATS.join(', ')})`);
const dpi = Number(values.dpi);
if (!(dpi >= 150 && dpi <= 600)) fail('--dpi: choose from 150 to 600');
const paper = values.paper === 'a4' ? PAPER_SIZES.a4 : PAPER_SIZES.letter;
if (document.printArea.width > paper.width || document.printArea.height > paper.height)
  fail(`The print area does not fit on ${paper.label} paper.`);
const bleedMm = parseLength(values.bleed!, 'mm') ?? fail('--bleed: give a length like 1mm');

const images = new Map<string, Buffer>();
const pieces = [];
for (const piece of document.pieces) {
  const artFile = art[piece.artId] ?? fail(`Piece ${piece.id}: its art ${piece.artId} is not listed in ${file}`);
  if (!images.has(artFile)) images.set(artFile, await readFile(artFile).catch(() => fail(`${artFile}: no such file`)));
  try {
    pieces.push(
      await exportPiece(
        piece,
        path.basename(artFile),
        pieceOutlineOptions(DEFAULT_ART_BACKGROUND, piece, { ...DEFAULT_PREFLIGHT_LIMITS, dpi }),
        bleedMm,
        (options) => outline(images.get(artFile)!, options),
      ),
    );
  } catch (error) {
    fail(`${artFile}: ${error instanceof OutlineInputError ? error.message : (error as Error).message}`);
  }
}
try {
  const name = values.name ?? path.basename(file).replace(/\.json$/, '');
  const started = performance.now();
  const result = await exportSheet(
    {
      name,
      unit: 'in',
      doc: document,
      pieces,
      paper: {
        paperWidthMm: paper.width,
        paperHeightMm: paper.height,
        areaXMm: (paper.width - document.printArea.width) / 2,
        areaYMm: (paper.height - document.printArea.height) / 2,
      },
    },
    {
      ...DEFAULT_EXPORT_OPTIONS,
      dpi,
      formats,
      background: values.background === 'white' ? 'white' : 'transparent',
      bleedMm,
      dxfUnit: values['dxf-unit'] === 'in' ? 'in' : 'mm',
    },
  );
  await mkdir(values.out!, { recursive: true });
  for (const f of result.files) await writeFile(path.join(values.out!, f.name), f.data);
  await writeFile(path.join(values.out!, result.zipName), result.zip);
  console.log(
    JSON.stringify({
      files: [...result.files.map((f) => f.name), result.zipName],
      pieces: pieces.length,
      ms: Math.round(performance.now() - started),
    }),
  );
} catch (error) {
  if (error instanceof ExportInputError) fail(error.message);
  throw error;
}
