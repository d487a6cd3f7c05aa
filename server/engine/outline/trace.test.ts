// Our marching squares against d3-contour (a separate implementation of the same published
// algorithm) on smooth fields with saddles, bays and islands: the same outer rings, vertex for vertex
// where no saddle is split differently, and the same enclosed areas.
import { contours } from 'd3-contour';
import { describe, expect, it } from 'vitest';
import { traceOuterRings } from './trace';

function field(width: number, height: number, seed: number): Float32Array {
  const f = new Float32Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const r = Math.hypot(x - width / 2, y - height / 2) + 9 * Math.sin(x / (5 + seed)) * Math.cos(y / (3 + seed));
      // A main blob, a small island to its side, and nothing on the canvas edge.
      const island = 6 - Math.hypot(x - width * 0.1, y - height * 0.15);
      f[y * width + x] = Math.max(Math.min(4, (width * 0.3 - r) / 2), island);
      if (x < 2 || y < 2 || x >= width - 2 || y >= height - 2) f[y * width + x] = -2;
    }
  }
  return f;
}

const shoelace = (ring: Array<[number, number]> | Array<{ x: number; y: number }>) => {
  const pts = ring.map((p) => (Array.isArray(p) ? { x: p[0], y: p[1] } : p));
  let twice = 0;
  for (let i = 0; i < pts.length; i++) twice += pts[i].x * pts[(i + 1) % pts.length].y - pts[(i + 1) % pts.length].x * pts[i].y;
  return twice / 2;
};

describe('traceOuterRings', () => {
  for (const seed of [1, 2, 3]) {
    it(`finds the rings d3-contour finds (field ${seed}), clockwise on screen, largest first`, () => {
      const width = 160,
        height = 120;
      const values = field(width, height, seed).map((v) => (v === 0 ? 1e-6 : v)); // as traceOuterRings nudges
      const ours = traceOuterRings(Float32Array.from(values), width, height);
      const [layer] = contours().size([width, height]).thresholds([0])(values as unknown as number[]);
      const theirs = layer.coordinates.map((polygon) => polygon[0].slice(0, -1) as Array<[number, number]>);
      expect(ours.length).toBe(theirs.length);
      expect(ours.length).toBeGreaterThanOrEqual(2); // the blob and the island
      theirs.sort((a, b) => Math.abs(shoelace(b)) - Math.abs(shoelace(a)));
      for (const [k, ring] of ours.entries()) {
        expect(shoelace(ring)).toBeGreaterThan(0); // clockwise with y down
        expect(shoelace(ring)).toBeCloseTo(Math.abs(shoelace(theirs[k])), 6);
        const theirPoints = new Set(theirs[k].map(([x, y]) => `${x.toFixed(6)} ${y.toFixed(6)}`));
        const shared = ring.filter((p) => theirPoints.has(`${p.x.toFixed(6)} ${p.y.toFixed(6)}`)).length;
        expect(shared / ring.length).toBeGreaterThan(0.99);
      }
    });
  }
});
