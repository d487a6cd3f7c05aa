// npm run arrange -- <art>=<count>@<width>... --sheet 6.75x9.25in [--gap 0.125in] [--margin 0in]
//   [--border 0.125in] [--rotate 90|none|15] [--fill] [--time 2s] [--seed 1] [--threads N] --out <dir>
// Outlines each art file, arranges the pieces and writes sheet.json (the sheet document with the art
// files), sheet.svg (every cut line, in mm) and sheet.png (the print image at 300 DPI); more sheets
// when one is not enough (sheet-2.*). Prints one JSON line. No database needed. The search runs on
// --threads worker threads at once (default: one per core but one), each with its own seed.
import { DEFAULT_ART_BACKGROUND, pieceOutlineOptions } from '../shared/sheet/outline-request';
import { DEFAULT_PREFLIGHT_LIMITS } from '../shared/sheet/preflight';
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { fail } from './cli';
import type { ArrangeItem, RotateMode } from '../shared/arrange/nester';
import { ArrangeInputError } from '../shared/arrange/nester';
import { arrangeInThreads, defaultThreads } from '../server/engine/arrange/parallel';
import type { Piece, SheetDocument } from '../shared/sheet/document';
import { SHEET_SCHEMA_VERSION } from '../shared/sheet/document';
import { parseLength } from '../shared/units';
import { OutlineInputError } from '../server/engine/outline/errors';
import { outline } from '../server/engine/outline/outline';
import { sheetCutLines } from '../server/engine/export/geometry';
import { renderPrintImage } from '../server/engine/export/print-image';
import { cutSvg } from '../server/engine/export/svg';
import type { ExportSheet } from '../server/engine/export/types';

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    sheet: { type: 'string', default: '6.75x9.25in' },
    gap: { type: 'string', default: '0.125in' },
    margin: { type: 'string', default: '0in' },
    border: { type: 'string', default: '0.125in' },
    rotate: { type: 'string', default: '90' },
    fill: { type: 'boolean', default: false },
    time: { type: 'string', default: '2s' },
    seed: { type: 'string', default: '1' },
    threads: { type: 'string' },
    dpi: { type: 'string', default: '300' },
    out: { type: 'string' },
  },
});
if (!values.out || positionals.length === 0)
  fail(
    'usage: npm run arrange -- <art>=<count>@<width>... --sheet 6.75x9.25in [--gap 0.125in] [--margin 0in] [--border 0.125in] [--rotate 90] [--fill] [--time 2s] [--seed 1] [--threads N] --out <dir>',
  );

const sheetMatch = /^([\d.]+)x([\d.]+)(mm|in)$/i.exec(values.sheet!);
if (!sheetMatch) fail(`--sheet: give the print area like 6.75x9.25in or 171x235mm (got "${values.sheet}")`);
const width = parseLength(`${sheetMatch![1]}${sheetMatch![3]}`)!,
  height = parseLength(`${sheetMatch![2]}${sheetMatch![3]}`)!;
const length = (flag: string, text: string) =>
  parseLength(text, 'mm') ?? fail(`--${flag}: give a length like 0.125in or 3mm (got "${text}")`);
const gap = length('gap', values.gap!),
  margin = length('margin', values.margin!),
  border = length('border', values.border!);
const rotate: RotateMode =
  values.rotate === 'none' || values.rotate === '0' ? 'none' : values.rotate === '90' ? '90' : { step: Number(values.rotate) };
if (typeof rotate === 'object' && !(rotate.step > 0)) fail(`--rotate: give none, 90 or a step in degrees such as 15`);
const timeMs = /^([\d.]+)(ms|s)?$/.exec(values.time!)
  ? Number(/^([\d.]+)/.exec(values.time!)![1]) * (values.time!.endsWith('ms') ? 1 : 1000)
  : fail('--time: give a duration like 2s');
const dpi = Number(values.dpi);
const threads = values.threads === undefined ? defaultThreads() : Number(values.threads);
if (!Number.isInteger(threads) || threads < 1 || threads > 64)
  fail(`--threads: give a whole number of threads from 1 to 64 (got "${values.threads}")`);

const problems: string[] = [];
const items: Array<ArrangeItem & { width: number }> = [];
const files = new Map<string, { file: string; png: Buffer; widthMm: number; heightMm: number }>();
for (const [index, spec] of positionals.entries()) {
  const match = /^(.+)=(\d+)@(.+)$/.exec(spec);
  if (!match) {
    problems.push(`${spec}: write each piece as <art>=<count>@<width>, e.g. fox.png=6@2in`);
    continue;
  }
  const [, file, countText, widthText] = match;
  const artWidth = parseLength(widthText, 'mm');
  if (!artWidth) {
    problems.push(`${file}: "${widthText}" is not a width like 2in or 50mm`);
    continue;
  }
  try {
    // The same request a sheet piece makes (white border, default background), at the CLI's resolution.
    const result = await outline(
      await readFile(file),
      pieceOutlineOptions(
        DEFAULT_ART_BACKGROUND,
        { width: artWidth, border, borderColour: '#ffffff' },
        { ...DEFAULT_PREFLIGHT_LIMITS, dpi },
      ),
    );
    const piece = result.pieces[0];
    const key = String(index + 1);
    files.set(key, { file: path.resolve(file), png: piece.png, widthMm: piece.widthMm, heightMm: piece.heightMm });
    items.push({
      key,
      name: path.basename(file),
      count: Number(countText),
      outline: { points: piece.cutLine.points, widthMm: piece.widthMm, heightMm: piece.heightMm },
      width: artWidth,
    });
  } catch (error) {
    problems.push(
      `${file}: ${error instanceof OutlineInputError ? error.message : (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (error as Error).message}`,
    );
  }
}

let result;
try {
  result = await arrangeInThreads(
    items,
    { width, height, gap, margin, rotate, fill: values.fill, timeMs, seed: Number(values.seed) },
    [],
    threads,
  ).done;
} catch (error) {
  if (error instanceof ArrangeInputError) fail(error.message);
  throw error;
}
for (const u of result.unplaced) problems.push(u.reason);

await mkdir(values.out!, { recursive: true });
const widthOf = new Map(items.map((i) => [i.key, i.width]));
for (let s = 0; s < result.sheets; s++) {
  const suffix = s === 0 ? '' : `-${s + 1}`;
  const placements = result.placements.filter((p) => p.sheet === s);
  const pieces: Piece[] = placements.map((p, i) => ({
    id: `p${i + 1}`,
    artId: p.key,
    x: p.x,
    y: p.y,
    rotation: p.rotation,
    width: widthOf.get(p.key)!,
    border,
    borderColour: '#ffffff',
    locked: false,
  }));
  const document: SheetDocument = {
    schemaVersion: SHEET_SCHEMA_VERSION,
    printArea: { width, height },
    safeMargin: margin,
    minGap: gap,
    pieces,
  };
  const art = Object.fromEntries([...new Set(pieces.map((p) => p.artId))].map((key) => [key, files.get(key)!.file]));
  await writeFile(path.join(values.out!, `sheet${suffix}.json`), `${JSON.stringify({ document, art }, null, 2)}\n`);

  // The cut file and the print image come from the exporter, so they match what a sheet exports.
  const sheet: ExportSheet = {
    name: `sheet${suffix}`,
    unit: 'mm',
    doc: document,
    pieces: pieces.map((piece) => {
      const f = files.get(piece.artId)!;
      const o = items.find((it) => it.key === piece.artId)!.outline;
      return { piece, name: path.basename(f.file), cutLine: o, raster: { png: f.png, widthMm: f.widthMm, heightMm: f.heightMm } };
    }),
    paper: { paperWidthMm: width, paperHeightMm: height, areaXMm: 0, areaYMm: 0 },
  };
  await writeFile(path.join(values.out!, `sheet${suffix}.svg`), cutSvg(sheet, sheetCutLines(sheet, null)));
  await writeFile(path.join(values.out!, `sheet${suffix}.png`), await renderPrintImage(sheet, dpi, 'transparent'));
}

for (const problem of problems) console.error(`problem: ${problem}`);
console.log(
  JSON.stringify({
    requested: result.requested,
    placed: result.placed,
    sheets: result.sheets,
    areaUsed: result.areaUsed.map((a) => Number(a.toFixed(4))),
    ms: result.ms,
    threads,
    problems,
  }),
);
process.exit(problems.length > 0 ? 1 : 0);
