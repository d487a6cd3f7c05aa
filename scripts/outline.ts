// npm run outline -- <file-or-folder>... --width 2in --border 3mm [--height 3in] [--dpi 300]
//   [--background auto|keep|#rrggbb] [--tolerance 32] [--islands join|split] --out <dir> [--json]
// Writes <name>.png (the bordered sticker, pHYs set) and <name>.svg (the cut line alone) for each
// image; no database needed. Bad files are reported by name and the rest still run; the exit
// status is 1 when any file failed.
import { mkdir, readdir, readFile, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import type { OutlineOptionsInput } from '../shared/schemas/outline';
import { outlineOptionsSchema } from '../shared/schemas/outline';
import { OutlineInputError } from '../server/engine/outline/errors';
import { outline } from '../server/engine/outline/outline';
import { cutLineSvg } from '../server/engine/outline/svg';

const IMAGE = /\.(png|jpe?g|webp)$/i;

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    width: { type: 'string' },
    height: { type: 'string' },
    border: { type: 'string' },
    dpi: { type: 'string' },
    background: { type: 'string' },
    tolerance: { type: 'string' },
    islands: { type: 'string' },
    out: { type: 'string' },
    json: { type: 'boolean', default: false },
    help: { type: 'boolean', default: false },
  },
});

if (values.help || positionals.length === 0 || !values.out) {
  console.error(
    'usage: npm run outline -- <file-or-folder>... --width 2in --border 3mm [--dpi 300] [--background auto|keep|#ffffff] [--islands join|split] --out <dir> [--json]',
  );
  process.exit(values.help ? 0 : 2);
}

const background =
  values.background && /^#?[0-9a-f]{6}$/i.test(values.background)
    ? { colour: values.background, tolerance: Number(values.tolerance ?? 32) }
    : values.background;
const parsed = outlineOptionsSchema.safeParse({
  width: values.width,
  height: values.height,
  border: values.border,
  dpi: values.dpi,
  background,
  backgroundTolerance: values.tolerance,
  islands: values.islands,
} satisfies Record<string, unknown>);
if (!parsed.success) {
  for (const issue of parsed.error.issues) console.error(`--${issue.path.join('.') || 'options'}: ${issue.message}`);
  process.exit(2);
}
const options: OutlineOptionsInput = parsed.data;

async function collect(inputs: string[]): Promise<string[]> {
  const files: string[] = [];
  for (const input of inputs) {
    const info = await stat(input).catch(() => null);
    if (info?.isDirectory()) {
      for (const entry of (await readdir(input)).sort()) if (IMAGE.test(entry)) files.push(path.join(input, entry));
    } else {
      files.push(input); // missing or odd files are reported below, by name
    }
  }
  return files;
}

await mkdir(values.out, { recursive: true });
let failed = 0;
for (const file of await collect(positionals)) {
  const name = path.basename(file).replace(/\.[^.]+$/, '');
  try {
    const result = await outline(await readFile(file), options);
    const written = [];
    for (const [i, piece] of result.pieces.entries()) {
      const base = result.pieces.length === 1 ? name : `${name}-${i + 1}`;
      await writeFile(path.join(values.out, `${base}.png`), piece.png);
      await writeFile(path.join(values.out, `${base}.svg`), cutLineSvg(piece, `${base}: cut line`));
      written.push({
        png: `${base}.png`,
        svg: `${base}.svg`,
        widthMm: piece.widthMm,
        heightMm: piece.heightMm,
        areaMm2: piece.areaMm2,
        perimeterMm: piece.perimeterMm,
      });
    }
    const summary = {
      file,
      ok: true,
      areaMm2: written.reduce((s, p) => s + p.areaMm2, 0),
      perimeterMm: written.reduce((s, p) => s + p.perimeterMm, 0),
      effectiveDpi: Math.round(result.effectiveDpi),
      pieces: written,
      warnings: result.warnings.map((w) => ({ code: w.code, severity: w.severity, message: w.message })),
    };
    if (values.json) console.log(JSON.stringify(summary));
    else {
      console.log(
        `${file}: ${written.length} piece${written.length === 1 ? '' : 's'}, ${summary.areaMm2.toFixed(1)} mm², cut ${summary.perimeterMm.toFixed(1)} mm, ${summary.effectiveDpi} DPI`,
      );
      for (const w of result.warnings) console.log(`  ${w.severity}: ${w.message}`);
    }
  } catch (error) {
    failed++;
    const reason =
      error instanceof OutlineInputError
        ? error.message
        : (error as NodeJS.ErrnoException).code === 'ENOENT'
          ? 'No such file.'
          : `Unexpected error: ${(error as Error).message}`;
    if (values.json) console.log(JSON.stringify({ file, ok: false, error: reason }));
    else console.error(`${file}: FAILED: ${reason}`);
  }
}
process.exit(failed > 0 ? 1 : 0);
