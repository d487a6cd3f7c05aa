import { execFile } from 'node:child_process';
import { mkdtemp, readFile, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { XMLParser } from 'fast-xml-parser';
import { svgPathBbox } from 'svg-path-bbox';
import { describe, expect, it } from 'vitest';
import { svgArt } from '../helpers/art';
import { pngPhys, pngSize } from '../helpers/png';

const run = promisify(execFile);

describe('npm run outline (CLI, no database)', () => {
  it('writes a PNG and an SVG per good file, reports bad files by name, exits 1', async () => {
    const dir = await mkdtemp(path.join(tmpdir(), 'sheetsmith-cli-'));
    const input = path.join(dir, 'in');
    const out = path.join(dir, 'out');
    await mkdir(input);
    await writeFile(
      path.join(input, 'acorn.png'),
      await svgArt(
        800,
        1000,
        '<ellipse cx="400" cy="560" rx="300" ry="380" fill="#935116"/><rect x="150" y="80" width="500" height="200" rx="90" fill="#4a235a"/>',
      ),
    );
    await writeFile(
      path.join(input, 'moon.png'),
      await svgArt(600, 600, '<path d="M300 50 A250 250 0 1 0 550 300 A190 190 0 1 1 300 50 Z" fill="#f4d03f"/>'),
    );
    await writeFile(path.join(input, 'notes.png'), 'not really a png');

    const result = await run(
      'npx',
      ['--no-install', 'tsx', 'scripts/outline.ts', input, '--width', '2in', '--border', '3mm', '--out', out, '--json'],
      { cwd: process.cwd() },
    ).catch((e) => e);
    expect(result.code).toBe(1);
    const lines = String(result.stdout)
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines.map((l) => [path.basename(l.file), l.ok])).toEqual([
      ['acorn.png', true],
      ['moon.png', true],
      ['notes.png', false],
    ]);
    expect(lines[2].error).toMatch(/not an image/);

    for (const line of lines.filter((l) => l.ok)) {
      const [piece] = line.pieces;
      expect(line.areaMm2).toBeGreaterThan(0);
      expect(line.perimeterMm).toBeGreaterThan(0);
      expect(line.effectiveDpi).toBeGreaterThan(0);
      // PNG: round(finished size × 300 DPI) px, pHYs 11811 px/m (PNG spec §11.3.5.3)
      const png = await readFile(path.join(out, piece.png));
      expect(pngSize(png)).toEqual({ width: Math.round((piece.widthMm / 25.4) * 300), height: Math.round((piece.heightMm / 25.4) * 300) });
      expect(pngPhys(png)).toEqual({ x: 11811, y: 11811, unit: 1 });
      expect(Math.abs(piece.widthMm - (50.8 + 6))).toBeLessThan(25.4 / 300); // 2 in of art + 3 mm each side

      // SVG read back with a general-purpose XML parser (fast-xml-parser): width/height in mm
      // agree with the viewBox (CSS/SVG units, 1in = 25.4mm), one closed path, its bounds inside the frame.
      const svg = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(
        await readFile(path.join(out, piece.svg), 'utf8'),
      ).svg;
      const [vx, vy, vw, vh] = String(svg.viewBox).split(' ').map(Number);
      expect([vx, vy]).toEqual([0, 0]);
      expect(svg.width).toBe(`${vw}mm`);
      expect(svg.height).toBe(`${vh}mm`);
      expect(Array.isArray(svg.path)).toBe(false);
      expect((svg.path.d.match(/M/g) ?? []).length).toBe(1);
      expect(svg.path.d.trim().endsWith('Z')).toBe(true);
      // Path bounds by svg-path-bbox: the cut line spans the frame to within 1 px at 300 DPI.
      const [minX, minY, maxX, maxY] = svgPathBbox(svg.path.d);
      const px = 25.4 / 300;
      expect(Math.abs(minX)).toBeLessThan(px);
      expect(Math.abs(minY)).toBeLessThan(px);
      expect(Math.abs(maxX - vw)).toBeLessThan(px);
      expect(Math.abs(maxY - vh)).toBeLessThan(px);
    }
  });

  it('refuses bad options with a message naming the flag', async () => {
    const result = await run('npx', ['--no-install', 'tsx', 'scripts/outline.ts', 'x.png', '--width', 'wide', '--out', tmpdir()]).catch(
      (e) => e,
    );
    expect(result.code).toBe(2);
    expect(String(result.stderr)).toMatch(/--width: Printed width: give a length like 2in/);
  });
});
