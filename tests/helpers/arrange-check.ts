import Flatten from '@flatten-js/core';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { expect } from 'vitest';
import { nestingDir } from '../../scripts/bench/nesting-dir';
import type { ArrangeItem, ArrangeResult, Outline } from '@shared/arrange/nester';

export const SHEET_W = 171.45,
  SHEET_H = 234.95;

/**
 * An independent validity check: it places each cut line itself (rotation about the frame centre,
 * then the piece position) and measures with @flatten-js/core, a general geometry package from npm,
 * not with any of the packer's own geometry.
 */
export function checkLayout(
  items: Array<{ key: string; outline: Outline }>,
  result: ArrangeResult,
  opts: { gap: number; margin: number; width?: number; height?: number },
) {
  const W = opts.width ?? SHEET_W,
    H = opts.height ?? SHEET_H;
  const outlines = new Map(items.map((i) => [i.key, i.outline]));
  const bySheet = new Map<number, Flatten.Polygon[]>();
  for (const p of result.placements) {
    const o = outlines.get(p.key)!;
    const a = (p.rotation * Math.PI) / 180;
    const points = o.points.map((q) => {
      const dx = q.x - o.widthMm / 2,
        dy = q.y - o.heightMm / 2;
      return new Flatten.Point(p.x + dx * Math.cos(a) - dy * Math.sin(a), p.y + dx * Math.sin(a) + dy * Math.cos(a));
    });
    for (const q of points) {
      expect(q.x).toBeGreaterThanOrEqual(opts.margin - 1e-6);
      expect(q.y).toBeGreaterThanOrEqual(opts.margin - 1e-6);
      expect(q.x).toBeLessThanOrEqual(W - opts.margin + 1e-6);
      expect(q.y).toBeLessThanOrEqual(H - opts.margin + 1e-6);
    }
    const list = bySheet.get(p.sheet) ?? [];
    list.push(new Flatten.Polygon(points));
    bySheet.set(p.sheet, list);
  }
  let closest = Infinity;
  for (const polygons of bySheet.values()) {
    for (let i = 0; i < polygons.length; i++) {
      for (let j = i + 1; j < polygons.length; j++) {
        const [distance] = polygons[i].distanceTo(polygons[j]);
        closest = Math.min(closest, distance);
        expect(distance).toBeGreaterThanOrEqual(opts.gap - 1e-6);
        // At a gap of 0 a distance cannot tell touching from crossing: the shared area must be nil.
        if (opts.gap === 0 && distance === 0)
          expect(Flatten.BooleanOperations.intersect(polygons[i], polygons[j]).area()).toBeLessThan(1e-3);
      }
    }
  }
  return closest;
}

type Instance = {
  strip_height: number;
  items: Array<{ id: number; demand: number; allowed_orientations?: number[]; shape: { data: number[][] } }>;
};

/**
 * An ESICUP instance from ../shared/nesting/ (read from there, never copied) as arrange items:
 * scaled so the strip is `stripHeight` mm high, or so the median piece's larger side is `medianSide`
 * mm; each polygon moved to its box's corner and made clockwise (y down), as cut lines are stored.
 */
export function esicupItems(name: string, scale: { stripHeight: number } | { medianSide: number }): ArrangeItem[] {
  const instance = JSON.parse(readFileSync(path.join(nestingDir(), `${name}.json`), 'utf8')) as Instance;
  const side = (data: number[][]) =>
    Math.max(
      Math.max(...data.map((p) => p[0])) - Math.min(...data.map((p) => p[0])),
      Math.max(...data.map((p) => p[1])) - Math.min(...data.map((p) => p[1])),
    );
  const sides = instance.items.map((i) => side(i.shape.data)).sort((a, b) => a - b);
  const k = 'stripHeight' in scale ? scale.stripHeight / instance.strip_height : scale.medianSide / sides[sides.length >> 1];
  return instance.items.map((item) => {
    const xs = item.shape.data.map((p) => p[0] * k),
      ys = item.shape.data.map((p) => p[1] * k);
    const x0 = Math.min(...xs),
      y0 = Math.min(...ys);
    let points = item.shape.data.map(([x, y]) => ({ x: x * k - x0, y: y * k - y0 }));
    if (points.length > 1 && points[0].x === points.at(-1)!.x && points[0].y === points.at(-1)!.y) points = points.slice(0, -1);
    const signed = points.reduce((s, p, i) => s + p.x * points[(i + 1) % points.length].y - points[(i + 1) % points.length].x * p.y, 0);
    if (signed < 0) points.reverse();
    return {
      key: String(item.id),
      count: item.demand,
      rotate: { set: item.allowed_orientations ?? [0] },
      outline: { points, widthMm: Math.max(...xs) - x0, heightMm: Math.max(...ys) - y0 },
    };
  });
}
