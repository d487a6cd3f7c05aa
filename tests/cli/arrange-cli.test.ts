import { execFile } from 'node:child_process';
import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { XMLParser } from 'fast-xml-parser';
import { svgPathBbox } from 'svg-path-bbox';
import { describe, expect, it } from 'vitest';
import { sheetDocumentSchema } from '@shared/sheet/document';
import { svgArt } from '../helpers/art';
import { pngPhys, pngSize } from '../helpers/png';

const run = promisify(execFile);

describe('npm run arrange (CLI, no database)', () => {
  it('writes sheet.json, sheet.svg and a 300 DPI sheet.png, names the unreadable file, arranges the rest', async () => {
    const dir = await mkdtemp(path.join(tmpdir(), 'sheetsmith-arrange-'));
    const fox = path.join(dir, 'fox.png'),
      leaf = path.join(dir, 'leaf.png'),
      junk = path.join(dir, 'junk.png');
    await writeFile(
      fox,
      await svgArt(
        900,
        700,
        '<ellipse cx="450" cy="350" rx="400" ry="300" fill="#d35400"/><circle cx="700" cy="150" r="120" fill="#d35400"/>',
      ),
    );
    await writeFile(leaf, await svgArt(600, 900, '<path d="M300 30 C560 300 560 600 300 870 C40 600 40 300 300 30 Z" fill="#229954"/>'));
    await writeFile(junk, 'not an image at all');
    const out = path.join(dir, 'out');
    const result = await run('npx', [
      '--no-install',
      'tsx',
      'scripts/arrange.ts',
      `${fox}=5@1.5in`,
      `${leaf}=4@1in`,
      `${junk}=2@1in`,
      '--sheet',
      '6.75x9.25in',
      '--gap',
      '0.125in',
      '--margin',
      '0.1in',
      '--time',
      '1s',
      '--threads',
      '2',
      '--out',
      out,
    ]).catch((e) => e);
    expect(result.code).toBe(1);
    const summary = JSON.parse(String(result.stdout).trim());
    expect(summary).toMatchObject({ requested: 9, placed: 9, sheets: 1, threads: 2 });
    expect(summary.problems).toEqual([`${junk}: This file is not an image Sheetsmith can read. Use PNG, JPEG or WebP.`]);

    const saved = JSON.parse(await readFile(path.join(out, 'sheet.json'), 'utf8'));
    const document = sheetDocumentSchema.parse(saved.document);
    expect(document.pieces).toHaveLength(9);
    expect(document.printArea.width).toBeCloseTo(171.45, 9);
    expect(Object.values(saved.art).sort()).toEqual([fox, leaf].sort());

    // 6.75 × 9.25 in at 300 DPI = 2025 × 2775 px, pHYs 11811 px/m (PNG spec §11.3.5.3).
    const png = await readFile(path.join(out, 'sheet.png'));
    expect(pngSize(png)).toEqual({ width: 2025, height: 2775 });
    expect(pngPhys(png)).toEqual({ x: 11811, y: 11811, unit: 1 });

    // The SVG read back with fast-xml-parser and svg-path-bbox: print-area size in mm, nine closed
    // paths, each inside the print area less the margin.
    const svg = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(
      await readFile(path.join(out, 'sheet.svg'), 'utf8'),
    ).svg;
    expect(svg.width).toBe('171.45mm');
    expect(svg.viewBox).toBe('0 0 171.45 234.95');
    const paths = svg.g.path as Array<{ d: string }>;
    expect(paths).toHaveLength(9);
    for (const p of paths) {
      const [x0, y0, x1, y1] = svgPathBbox(p.d);
      expect(x0).toBeGreaterThanOrEqual(2.54 - 1e-6);
      expect(y0).toBeGreaterThanOrEqual(2.54 - 1e-6);
      expect(x1).toBeLessThanOrEqual(171.45 - 2.54 + 1e-6);
      expect(y1).toBeLessThanOrEqual(234.95 - 2.54 + 1e-6);
    }
  });
});
