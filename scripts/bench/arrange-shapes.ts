// A fixed set of irregular cut-line shapes for the arrange benchmark and tests: blobs, stars, L and T
// shapes, crescents and a two-part shape joined by a bridge. Millimetres, frame origin top-left.
import type { Ring } from '@shared/geometry/polygon';
import type { Outline } from '@shared/arrange/nester';

const frame = (ring: Ring): Outline => {
  const minX = Math.min(...ring.map((p) => p.x)),
    minY = Math.min(...ring.map((p) => p.y));
  const points = ring.map((p) => ({ x: p.x - minX, y: p.y - minY }));
  return { points, widthMm: Math.max(...points.map((p) => p.x)), heightMm: Math.max(...points.map((p) => p.y)) };
};

const polar = (n: number, r: (t: number) => number): Ring =>
  Array.from({ length: n }, (_, i) => {
    const t = (2 * Math.PI * i) / n;
    return { x: r(t) * Math.cos(t), y: r(t) * Math.sin(t) };
  });

export const disk = (d: number) => frame(polar(96, () => d / 2));
export const blob = (d: number, seed: number) =>
  frame(polar(96, (t) => (d / 2) * (1 + 0.18 * Math.sin(3 * t + seed) + 0.1 * Math.cos(5 * t + 2 * seed))));
export const star = (d: number, spikes = 5) =>
  frame(polar(spikes * 2 * 8, (t) => (d / 2) * (0.55 + 0.45 * Math.abs(Math.cos((spikes * t) / 2)) ** 1.5)));
export const lShape = (s: number, t: number) =>
  frame([
    { x: 0, y: 0 },
    { x: t, y: 0 },
    { x: t, y: s - t },
    { x: s, y: s - t },
    { x: s, y: s },
    { x: 0, y: s },
  ]);
export const tShape = (s: number, t: number) =>
  frame([
    { x: 0, y: 0 },
    { x: s, y: 0 },
    { x: s, y: t },
    { x: (s + t) / 2, y: t },
    { x: (s + t) / 2, y: s },
    { x: (s - t) / 2, y: s },
    { x: (s - t) / 2, y: t },
    { x: 0, y: t },
  ]);
export const crescent = (d: number) => {
  // The outer circle less an inner circle shifted right: walk the outer arc round the left, then
  // the inner arc back (circle–circle intersection, any geometry handbook).
  const R = d / 2,
    c = 0.35 * R,
    r = 0.8 * R;
  const x = (R * R - r * r + c * c) / (2 * c),
    y = Math.sqrt(R * R - x * x);
  const t1 = Math.atan2(y, x),
    p1 = Math.atan2(y, x - c);
  const ring: Ring = [];
  for (let i = 0; i <= 40; i++) {
    const t = t1 + ((2 * Math.PI - 2 * t1) * i) / 40;
    ring.push({ x: R * Math.cos(t), y: R * Math.sin(t) });
  }
  for (let i = 1; i < 40; i++) {
    const t = -p1 - ((2 * Math.PI - 2 * p1) * i) / 40;
    ring.push({ x: c + r * Math.cos(t), y: r * Math.sin(t) });
  }
  return frame(ring);
};
/** Two disks joined by a bridge: what the outline engine makes of art with islands. */
export const dumbbell = (d: number, length: number) => {
  const r = d / 2,
    h = d / 10;
  const a = Math.asin(h / r);
  const ring: Ring = [];
  for (let i = 0; i <= 32; i++) {
    const t = a + ((2 * Math.PI - 2 * a) * i) / 32;
    ring.push({ x: r * Math.cos(t), y: r * Math.sin(t) });
  }
  for (let i = 0; i <= 32; i++) {
    const t = Math.PI + a + ((2 * Math.PI - 2 * a) * i) / 32;
    ring.push({ x: length + r * Math.cos(t), y: r * Math.sin(t) });
  }
  return frame(ring);
};

/** The benchmark mix: twelve shapes, about 25–45 mm across. */
export function benchmarkSet(): Array<{ key: string; outline: Outline }> {
  return [
    { key: 'blob-a', outline: blob(38, 0.3) },
    { key: 'blob-b', outline: blob(32, 1.7) },
    { key: 'star-5', outline: star(40, 5) },
    { key: 'star-6', outline: star(34, 6) },
    { key: 'l-shape', outline: lShape(40, 12) },
    { key: 'l-small', outline: lShape(30, 10) },
    { key: 't-shape', outline: tShape(40, 12) },
    { key: 't-small', outline: tShape(30, 9) },
    { key: 'crescent', outline: crescent(40) },
    { key: 'crescent-s', outline: crescent(30) },
    { key: 'dumbbell', outline: dumbbell(18, 28) },
    { key: 'disk', outline: disk(26) },
  ];
}
