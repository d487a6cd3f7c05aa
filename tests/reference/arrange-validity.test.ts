import { describe, expect, it } from 'vitest';
import type { ArrangeItem, Outline } from '@shared/arrange/nester';
import { ArrangeInputError, arrange } from '@shared/arrange/nester';
import { benchmarkSet, blob, disk, lShape, star } from '../../scripts/bench/arrange-shapes';
import { checkLayout, esicupItems, SHEET_H, SHEET_W } from '../helpers/arrange-check';

const W = SHEET_W,
  H = SHEET_H;

function seededRandom(seed: number) {
  let a = seed;
  return () => (a = (a * 1103515245 + 12345) % 2147483648) / 2147483648;
}

describe('arrange: every layout passes an independent validity check', () => {
  it('on the benchmark set, filling the sheet with 90° turns', () => {
    const set = benchmarkSet();
    const result = arrange(
      set.map((s) => ({ ...s, count: 1 })),
      { width: W, height: H, gap: 3.175, margin: 3.175, fill: true, timeMs: 800, seed: 3 },
    );
    expect(result.placed).toBeGreaterThan(20);
    const closest = checkLayout(set, result, { gap: 3.175, margin: 3.175 });
    expect(closest).toBeLessThan(4); // tight, not merely valid
  });

  for (const seed of [1, 2, 3]) {
    it(`on a random set with free rotation in 15° steps (seed ${seed}), over several sheets`, () => {
      const random = seededRandom(seed);
      const items: ArrangeItem[] = Array.from({ length: 6 }, (_, i) => {
        const size = 20 + random() * 30;
        const outline = [blob(size, random() * 6), star(size, 5 + (i % 3)), lShape(size, size / 3), disk(size)][i % 4];
        return { key: `shape-${i}`, outline, count: 2 + Math.floor(random() * 5), rotate: { step: 15 } };
      });
      const result = arrange(items, { width: W, height: H, gap: 2, margin: 5, timeMs: 400, seed });
      expect(result.placed).toBe(result.requested);
      checkLayout(items, result, { gap: 2, margin: 5 });
    });
  }
});

describe('arrange: fill the sheet with one disk', () => {
  it('places at least a hexagonal arrangement and no fewer than a square grid', () => {
    // Circle packing densities: hexagonal π/√12 ≈ 0.9069, square π/4 ≈ 0.7854 (any packing handbook).
    // Here counted constructively for this rectangle: each disk needs a circle of diameter D + gap,
    // in an area grown by half the gap on every side.
    const D = 25.4,
      gap = 3.175,
      pitch = D + gap;
    const w = W + gap,
      h = H + gap;
    const square = Math.floor(w / pitch) * Math.floor(h / pitch);
    const rows = Math.floor((h - pitch) / ((pitch * Math.sqrt(3)) / 2)) + 1;
    const long = Math.floor(w / pitch),
      short = Math.floor((w - pitch / 2) / pitch);
    const hexagonal = Math.ceil(rows / 2) * long + Math.floor(rows / 2) * short;
    expect(hexagonal).toBeGreaterThanOrEqual(square);
    // The density bound caps what any packing can reach in this area.
    const densityCap = Math.floor(((Math.PI / Math.sqrt(12)) * (w * h)) / (Math.PI * (pitch / 2) ** 2));

    const items = [{ key: 'disk', outline: disk(D), count: 1 }];
    const result = arrange(items, { width: W, height: H, gap, margin: 0, fill: true, rotate: 'none', maxIterations: 1, seed: 1 });
    checkLayout(items, result, { gap, margin: 0 });
    expect(result.placed).toBeGreaterThanOrEqual(hexagonal);
    expect(result.placed).toBeGreaterThanOrEqual(square);
    expect(result.placed).toBeLessThanOrEqual(densityCap);
  });
});

describe('arrange: locked pieces, seeds, quantities and bad input', () => {
  const items = () =>
    benchmarkSet()
      .slice(0, 6)
      .map((s) => ({ ...s, count: 3 }));

  it('never moves locked pieces and keeps clear of them', () => {
    const locked = [{ key: 'keep-me', x: 85, y: 117, rotation: 30, outline: star(50, 5) }];
    const result = arrange(items(), { width: W, height: H, gap: 3.175, margin: 3.175, timeMs: 300, seed: 5 }, locked);
    expect(result.placements.some((p) => p.key === 'keep-me')).toBe(false);
    const all = [...items(), { key: 'keep-me', outline: locked[0].outline }];
    checkLayout(
      all,
      { ...result, placements: [...result.placements, { key: 'keep-me', sheet: 0, x: 85, y: 117, rotation: 30 }] },
      { gap: 3.175, margin: 3.175 },
    );
  });

  it('gives the same layout for the same seed', () => {
    const options = { width: W, height: H, gap: 3.175, margin: 3.175, maxIterations: 6, timeMs: 60_000, seed: 42 };
    const a = arrange(items(), options);
    const b = arrange(items(), options);
    expect(a.placements).toEqual(b.placements);
    expect(a.iterations).toBe(6);
  });

  it('names the piece that is too large, refuses zero quantities, and still arranges the rest', () => {
    const result = arrange(
      [
        { key: 'giant', name: 'Giant moon', outline: disk(260), count: 1 },
        { key: 'none', name: 'Nothing owl', outline: disk(20), count: 0 },
        { key: 'ok', name: 'Small fox', outline: disk(20), count: 4 },
      ],
      { width: W, height: H, gap: 3.175, margin: 3.175, timeMs: 200 },
    );
    expect(result.placements.filter((p) => p.key === 'ok')).toHaveLength(4);
    expect(result.unplaced.map((u) => u.reason)).toEqual([
      'Nothing owl: the quantity must be a whole number above zero.',
      expect.stringMatching(/^Giant moon \(260\.0 × 260\.0 mm with its border\) is larger than the print area less the margin\.$/),
    ]);
  });

  it('refuses a margin that leaves no room, and a gap no piece can keep', () => {
    expect(() => arrange([{ key: 'a', outline: disk(20), count: 1 }], { width: W, height: H, margin: 90 })).toThrow(ArrangeInputError);
    expect(() => arrange([{ key: 'a', outline: disk(20), count: 1 }], { width: W, height: H, margin: 90 })).toThrow(/leaves no room/);
    // A 150 mm gap: one 60 mm disk per sheet (even corner to corner two are only 147 mm apart); the rest overflow.
    const result = arrange([{ key: 'a', outline: disk(60), count: 3 }], {
      width: W,
      height: H,
      gap: 150,
      margin: 0,
      timeMs: 100,
      maxSheets: 3,
    });
    expect(result.sheets).toBe(3);
    expect(result.placed).toBe(3);
  });
});

describe('arrange: the benchmark claim', () => {
  it('places at least 20 % more of the irregular set than a bounding-box packer (maxrects-packer)', async () => {
    const { MaxRectsPacker } = await import('maxrects-packer/dist/maxrects-packer.mjs');
    const set = benchmarkSet();
    const gap = 3.175,
      margin = 3.175;
    const packer = new MaxRectsPacker(W - 2 * margin + gap, H - 2 * margin + gap, 0, {
      smart: true,
      pot: false,
      square: false,
      allowRotation: true,
    });
    let boxes = 0;
    for (let round = 0, any = true; any && round < 50; round++) {
      any = false;
      for (const s of set) {
        packer.add(s.outline.widthMm + gap, s.outline.heightMm + gap, {});
        if (packer.bins.length > 1) packer.bins.pop();
        else {
          boxes++;
          any = true;
        }
      }
    }
    const ours = arrange(
      set.map((s) => ({ ...s, count: 1 })),
      { width: W, height: H, gap, margin, fill: true, maxIterations: 8, timeMs: 60_000, seed: 1 },
    );
    checkLayout(set, ours, { gap, margin });
    expect(ours.placed).toBeGreaterThanOrEqual(Math.ceil(boxes * 1.2));
  });
});

// ESICUP jakobs1 (../shared/nesting/, read from there): 25 pieces, quarter turns, scaled so the strip
// is 200 mm high. At a gap of 0 every spot must still be collision-free (it once checked nothing).
describe('arrange at a gap of 0 (ESICUP jakobs1)', () => {
  it('places no two pieces so that they cross, by @flatten-js/core boolean intersection', () => {
    // Quarter turns: the instance's own orientations.
    const items = esicupItems('jakobs1', { stripHeight: 200 });
    const width = 1200,
      height = 200;
    const result = arrange(items, { width, height, gap: 0, margin: 0, rotate: '90', timeMs: 1500, seed: 1 });
    expect(result.placed).toBe(25);
    checkLayout(items, result, { gap: 0, margin: 0, width, height });
  }, 60_000);
});

// Strip packing goes on past the constructive layout with the overlap search (a sequence of
// feasibility problems). ESICUP instances from ../shared/nesting/, read from there.
describe('strip packing with the overlap search (ESICUP shapes0 and jakobs1)', () => {
  for (const [name, gap] of [
    ['shapes0', 0],
    ['jakobs1', 0.5],
  ] as const) {
    it(`${name} at a gap of ${gap} mm: shorter than the constructive layout, valid by @flatten-js/core, the same for the same seed`, () => {
      const items = esicupItems(name, { stripHeight: 200 });
      const options = { width: 200, height: 2000, gap, margin: 0, strip: true, timeMs: 60_000, seed: 4 };
      const start = arrange(items, { ...options, maxIterations: 1 });
      const searched = arrange(items, { ...options, maxIterations: 5 });
      expect(searched.placed).toBe(start.placed);
      expect(searched.length!).toBeLessThan(start.length!);
      checkLayout(items, searched, { gap, margin: 0, width: 200, height: searched.length! + 1e-6 });
      expect(arrange(items, { ...options, maxIterations: 5 }).placements).toEqual(searched.placements);
    }, 120_000);
  }
});

describe('arrange: concavities and bad input', () => {
  // A U 60 mm square with a slot 30 mm wide and 44 mm deep open at the top, and a cross 24 mm across
  // with 8 mm arms: on an area only as large as the U, the cross can go nowhere but the slot.
  const U: Outline = {
    points: [
      { x: 0, y: 0 },
      { x: 15, y: 0 },
      { x: 15, y: 44 },
      { x: 45, y: 44 },
      { x: 45, y: 0 },
      { x: 60, y: 0 },
      { x: 60, y: 60 },
      { x: 0, y: 60 },
    ],
    widthMm: 60,
    heightMm: 60,
  };
  const cross: Outline = {
    points: [
      { x: 8, y: 0 },
      { x: 16, y: 0 },
      { x: 16, y: 8 },
      { x: 24, y: 8 },
      { x: 24, y: 16 },
      { x: 16, y: 16 },
      { x: 16, y: 24 },
      { x: 8, y: 24 },
      { x: 8, y: 16 },
      { x: 0, y: 16 },
      { x: 0, y: 8 },
      { x: 8, y: 8 },
    ],
    widthMm: 24,
    heightMm: 24,
  };

  it('places a cross inside a U when nothing else has room for it', () => {
    const items = [
      { key: 'u', outline: U, count: 1, priority: 1 },
      { key: 'cross', outline: cross, count: 1 },
    ];
    const result = arrange(items, { width: 61, height: 61, gap: 1, margin: 0, rotate: 'none', timeMs: 300, seed: 2 });
    expect(result.placed).toBe(2);
    checkLayout(items, result, { gap: 1, margin: 0, width: 61, height: 61 });
    const u = result.placements.find((p) => p.key === 'u')!,
      c = result.placements.find((p) => p.key === 'cross')!;
    // The cross's centre lies in the slot: between the U's arms and above its floor.
    expect(Math.abs(c.x - u.x)).toBeLessThan(15 - 12);
    expect(c.y - (u.y - 30)).toBeLessThan(44);
  });

  it('names each bad piece and still arranges the rest; a gap that leaves no room is refused', () => {
    const bowTie: Outline = {
      points: [
        { x: 0, y: 0 },
        { x: 20, y: 20 },
        { x: 20, y: 0 },
        { x: 0, y: 20 },
      ],
      widthMm: 20,
      heightMm: 20,
    };
    const result = arrange(
      [
        { key: 'bow', name: 'Bow tie', outline: bowTie, count: 1 },
        { key: 'none', name: 'Ghost', outline: disk(20), count: 0 },
        { key: 'minus', name: 'Pumpkin', outline: disk(20), count: -2 },
        { key: 'ok', name: 'Moon', outline: disk(20), count: 3 },
      ],
      { width: W, height: H, gap: 3.175, margin: 3.175, timeMs: 200 },
    );
    expect(result.placed).toBe(3);
    expect(result.unplaced.map((u) => u.reason)).toEqual([
      'Bow tie: its cut line crosses itself, so no blade can follow it.',
      'Ghost: the quantity must be a whole number above zero.',
      'Pumpkin: the quantity must be a whole number above zero.',
    ]);
    expect(() => arrange([{ key: 'a', outline: disk(20), count: 1 }], { width: W, height: H, gap: 200 })).toThrow(
      'A gap of 200 mm leaves no room on a 171.45 × 234.95 mm print area.',
    );
  });
});
