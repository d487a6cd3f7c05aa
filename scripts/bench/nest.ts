// npm run bench:nest -- <instance.json or folder>... [--time 60s] [--seed 1] [--out DIR] [--json] [--sticker] [--threads 1] [--gap 0.01]
//
// Strip packing on instances in the JSON layout of ../shared/nesting/ (ESICUP, as published with the
// code of Gardeyn, Vanden Berghe & Wauters 2025): a fixed strip height, every copy of every item placed at one of its
// allowed orientations, the length as short as possible. Each instance is scaled so the strip is
// 200 mm high (density does not change with scale) and packed by our nester at a 1 mm cell with a
// gap of 0.01 mm, or the --gap given (the reference runs kept none; --gap 0 lets pieces touch).
// Density = total item area / (strip height × length). One thread unless --threads asks for more
// (each its own seed, the best kept).
//
// --sticker runs the sticker protocol instead: the instance's shapes scaled so the median piece's
// larger side is 44.45 mm (1.75 in), filling a 171.45 × 234.95 mm print area with a 3.175 mm gap and
// margin, quarter turns, 2 s; beside it, in the same run, a bounding-box packer (maxrects-packer).
import { normaliseDegrees } from '@shared/units';
import { mkdir, readFile, readdir, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { MaxRectsPacker } from 'maxrects-packer/dist/maxrects-packer.mjs';
import type { ArrangeItem, RotateMode } from '@shared/arrange/nester';
import { arrange } from '@shared/arrange/nester';
import { arrangeInThreads } from '../../server/engine/arrange/parallel';
import { rotateRing } from '@shared/arrange/raster';
import type { Ring } from '@shared/geometry/polygon';
import { area, signedArea } from '@shared/geometry/polygon';
import { nestingDir } from './nesting-dir';

type Instance = {
  name: string;
  strip_height: number;
  items: Array<{ id: number; demand: number; allowed_orientations?: number[]; shape: { type: string; data: number[][] } }>;
};

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    time: { type: 'string', default: '60s' },
    seed: { type: 'string', default: '1' },
    out: { type: 'string' },
    json: { type: 'boolean', default: false },
    sticker: { type: 'boolean', default: false },
    threads: { type: 'string', default: '1' },
    gap: { type: 'string', default: '0.01' },
  },
});

const gap = Number(values.gap);
if (!Number.isFinite(gap) || gap < 0) throw new Error(`--gap: give the gap in mm, 0 or more (got ${values.gap})`);

const seconds = (text: string) => {
  const m = /^(\d+(?:\.\d+)?)(ms|s|m)?$/.exec(text.trim());
  if (!m) throw new Error(`--time: give a duration like 60s, 500ms or 2m (got ${text})`);
  const n = Number(m[1]);
  return m[2] === 'ms' ? n / 1000 : m[2] === 'm' ? n * 60 : n;
};

async function instanceFiles(args: string[]): Promise<string[]> {
  const files: string[] = [];
  for (const arg of args) {
    if ((await stat(arg)).isDirectory())
      files.push(
        ...(await readdir(arg))
          .filter((f) => f.endsWith('.json'))
          .sort()
          .map((f) => path.join(arg, f)),
      );
    else files.push(arg);
  }
  return files;
}

/** The item's polygon as a clockwise ring (y down) with its box at the origin, and that box's offset. */
function itemRing(data: number[][], k: number) {
  let pts = data.map(([x, y]) => ({ x: x * k, y: y * k }));
  if (pts.length > 1 && pts[0].x === pts.at(-1)!.x && pts[0].y === pts.at(-1)!.y) pts = pts.slice(0, -1);
  return pts;
}

const boxOf = (ring: Ring) => {
  const xs = ring.map((p) => p.x),
    ys = ring.map((p) => p.y);
  return { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) };
};

/** The instance's orientations as a rotate mode of our nester (degrees, the strip's frame). */
function rotateMode(orientations: number[] | undefined): RotateMode {
  const set = [...new Set((orientations ?? [0]).map(normaliseDegrees))].sort((a, b) => a - b);
  if (set.length === 1 && set[0] === 0) return 'none';
  if (set.length === 4 && set.join() === '0,90,180,270') return '90';
  return { set };
}

async function strip(file: string, timeS: number, seed: number) {
  const instance = JSON.parse(await readFile(file, 'utf8')) as Instance;
  const k = 200 / instance.strip_height;
  const H = 200;
  // Our nester fills top rows first (y down) in a fixed width; the strip runs along x with a fixed
  // height. Turning the whole problem by -90° (a rigid motion, so every allowed orientation stays
  // allowed) makes the strip's height our width and its length our height.
  const items: ArrangeItem[] = [];
  const frames = new Map<string, { ring: Ring; shift: { x: number; y: number }; w: number; h: number }>();
  let itemArea = 0,
    copies = 0;
  for (const item of instance.items) {
    const original = itemRing(item.shape.data, k);
    const turned = rotateRing(original, { x: 0, y: 0 }, -90);
    const b = boxOf(turned);
    let ring = turned.map((p) => ({ x: p.x - b.x0, y: p.y - b.y0 }));
    if (signedArea(ring) < 0) ring = [...ring].reverse();
    const key = String(item.id);
    frames.set(key, { ring: original, shift: { x: -b.x0, y: -b.y0 }, w: b.x1 - b.x0, h: b.y1 - b.y0 });
    items.push({
      key,
      name: `item ${item.id}`,
      count: item.demand,
      outline: { points: ring, widthMm: b.x1 - b.x0, heightMm: b.y1 - b.y0 },
      rotate: rotateMode(item.allowed_orientations),
    });
    itemArea += area(original) * item.demand;
    copies += item.demand;
  }
  const longest = items.reduce((s, i) => s + Math.max(i.outline.widthMm, i.outline.heightMm) * i.count, 0);
  const started = performance.now();
  const options = {
    width: H,
    height: longest,
    gap,
    margin: 0,
    strip: true,
    rotate: 'none' as const,
    timeMs: timeS * 1000,
    seed,
    maxSheets: 1,
  };
  const threads = Number(values.threads);
  const result = threads > 1 ? await arrangeInThreads(items, options, [], threads).done : arrange(items, options);
  const ms = performance.now() - started;
  // Back to the strip's frame: a point p of the item's own polygon lands at X = R(θ)p + t.
  const placements = result.placements.map((pl) => {
    const f = frames.get(pl.key)!;
    const a = (pl.rotation * Math.PI) / 180,
      c = Math.cos(a),
      s = Math.sin(a);
    // Our placement: q = R(-90)p + shift, placed at centre + R(θ)(q - (w/2, h/2)); then R(+90) back.
    const p0 = f.ring[0];
    const q = rotateRing([p0], { x: 0, y: 0 }, -90)[0];
    const local = { x: q.x + f.shift.x - f.w / 2, y: q.y + f.shift.y - f.h / 2 };
    const placed = { x: pl.x + local.x * c - local.y * s, y: pl.y + local.x * s + local.y * c };
    const back = { x: -placed.y, y: placed.x }; // R(+90) of (x, y) is (-y, x)… then mirror the length axis to start at 0
    return { key: pl.key, rotation: pl.rotation, p0, back };
  });
  // R(+90) sends our y (the length) to -x: the strip runs from -length to 0; shift it to start at 0.
  const length = result.length ?? 0;
  const out = placements.map(({ key, rotation, p0, back }) => {
    const a = (rotation * Math.PI) / 180,
      c = Math.cos(a),
      s = Math.sin(a);
    const X = back.x + length,
      Y = back.y;
    return { id: Number(key), rotation, x: X - (p0.x * c - p0.y * s), y: Y - (p0.x * s + p0.y * c) };
  });
  const density = length > 0 && result.placed === copies ? itemArea / (H * length) : 0;
  return {
    name: instance.name,
    pieces: copies,
    placed: result.placed,
    length,
    density,
    ms,
    iterations: result.iterations,
    out,
    items: instance.items,
    k,
  };
}

/** Every placed point inside 0 ≤ X ≤ length, 0 ≤ Y ≤ strip height (the output contract). */
function checkBounds(r: Awaited<ReturnType<typeof strip>>) {
  let worst = 0;
  for (const pl of r.out) {
    const item = r.items.find((i) => i.id === pl.id)!;
    const a = (pl.rotation * Math.PI) / 180,
      c = Math.cos(a),
      s = Math.sin(a);
    for (const p of itemRing(item.shape.data, r.k)) {
      const X = pl.x + p.x * c - p.y * s,
        Y = pl.y + p.x * s + p.y * c;
      worst = Math.max(worst, -X, X - r.length, -Y, Y - 200);
    }
  }
  return worst;
}

async function sticker(file: string, seed: number) {
  const instance = JSON.parse(await readFile(file, 'utf8')) as Instance;
  const W = 171.45,
    Hs = 234.95,
    GAP = 3.175,
    MARGIN = 3.175;
  const sides = instance.items
    .map((i) => {
      const b = boxOf(itemRing(i.shape.data, 1));
      return Math.max(b.x1 - b.x0, b.y1 - b.y0);
    })
    .sort((a, b) => a - b);
  const k = 44.45 / sides[sides.length >> 1];
  const items: ArrangeItem[] = instance.items.map((item) => {
    const ring0 = itemRing(item.shape.data, k);
    const b = boxOf(ring0);
    let ring = ring0.map((p) => ({ x: p.x - b.x0, y: p.y - b.y0 }));
    if (signedArea(ring) < 0) ring = [...ring].reverse();
    return { key: String(item.id), count: 1, outline: { points: ring, widthMm: b.x1 - b.x0, heightMm: b.y1 - b.y0 } };
  });
  const started = performance.now();
  const ours = arrange(items, { width: W, height: Hs, gap: GAP, margin: MARGIN, rotate: '90', fill: true, timeMs: 2000, seed });
  const ms = performance.now() - started;
  const packer = new MaxRectsPacker(W - 2 * MARGIN + GAP, Hs - 2 * MARGIN + GAP, 0, {
    smart: true,
    pot: false,
    square: false,
    allowRotation: true,
  });
  let boxes = 0,
    boxArea = 0;
  for (let round = 0, any = true; any && round < 200; round++) {
    any = false;
    for (const it of items) {
      packer.add(it.outline.widthMm + GAP, it.outline.heightMm + GAP, { key: it.key });
      if (packer.bins.length > 1) {
        packer.bins.pop();
        continue;
      }
      boxes++;
      boxArea += area(it.outline.points);
      any = true;
    }
  }
  return { name: instance.name, placed: ours.placed, areaUsed: ours.areaUsed[0], ms, boxes, boxAreaUsed: boxArea / (W * Hs) };
}

const files = await instanceFiles(positionals.length ? positionals : [nestingDir()]);
const seed = Number(values.seed);
if (values.sticker) {
  if (!values.json) console.log('sticker protocol: 171.45 × 234.95 mm, 3.175 mm gap and margin, quarter turns, 2 s; median piece 44.45 mm');
  for (const file of files) {
    const r = await sticker(file, seed);
    if (values.json) console.log(JSON.stringify(r));
    else
      console.log(
        `${r.name.padEnd(10)} true shapes ${String(r.placed).padStart(3)} pieces, ${(r.areaUsed * 100).toFixed(1)} % | boxes (maxrects-packer) ${String(r.boxes).padStart(3)}, ${(r.boxAreaUsed * 100).toFixed(1)} % | ratio ${(r.placed / r.boxes).toFixed(2)} | ${r.ms.toFixed(0)} ms`,
      );
  }
} else {
  const timeS = seconds(values.time!);
  if (!values.json)
    console.log(
      `strip packing: strip 200 mm high, cell 1 mm, gap ${gap} mm, the instance's rotations, ${timeS} s per instance, seed ${seed}`,
    );
  for (const file of files) {
    const r = await strip(file, timeS, seed);
    const outside = checkBounds(r);
    if (outside > 0.02) throw new Error(`${r.name}: a placed point lies ${outside.toFixed(3)} mm outside the strip; the layout is wrong.`);
    if (values.out) {
      await mkdir(values.out, { recursive: true });
      await writeFile(
        path.join(values.out, `${r.name}.json`),
        JSON.stringify(
          {
            name: r.name,
            length: r.length / r.k,
            placements: r.out.map((p) => ({ id: p.id, rotation: p.rotation, x: p.x / r.k, y: p.y / r.k })),
          },
          null,
          1,
        ),
      );
    }
    if (values.json)
      console.log(
        JSON.stringify({
          name: r.name,
          pieces: r.pieces,
          placed: r.placed,
          length: r.length / r.k,
          density: Number(r.density.toFixed(4)),
          ms: Math.round(r.ms),
        }),
      );
    else
      console.log(
        `${r.name.padEnd(10)} ${String(r.pieces).padStart(3)} pieces, ${r.placed} placed, length ${(r.length / r.k).toFixed(2)}, density ${(r.density * 100).toFixed(2)} %, ${r.ms.toFixed(0)} ms, ${r.iterations} layouts`,
      );
  }
}
