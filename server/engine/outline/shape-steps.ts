// Steps of the outline engine that stand on their own: what background the art has, which parts
// of it are specks, the parts the sticker holds together, and widening narrow parts when asked.
import type { Box } from '@shared/geometry/polygon';
import { distanceTransform } from '@shared/geometry/distance-transform';
import type { Component } from './components';
import { fillHoles, labelComponents } from './components';
import { erode, findNarrowParts, findNecks, thinResidue } from './necks';

/** True when (nearly) every pixel is within tolerance of the colour. */
export function isFlat(rgba: Buffer, colour: { r: number; g: number; b: number }, tolerance: number): boolean {
  let near = 0;
  const total = rgba.length / 4;
  for (let i = 0; i < rgba.length; i += 4) {
    if (Math.hypot(rgba[i] - colour.r, rgba[i + 1] - colour.g, rgba[i + 2] - colour.b) <= tolerance) near++;
  }
  return near >= 0.99 * total;
} // working margin (px) so traced rings never touch the canvas edge

export function unionBox(components: Component[]): Box {
  const minX = Math.min(...components.map((c) => c.minX)),
    minY = Math.min(...components.map((c) => c.minY));
  const maxX = Math.max(...components.map((c) => c.maxX)),
    maxY = Math.max(...components.map((c) => c.maxY));
  return { x: minX, y: minY, width: maxX - minX + 1, height: maxY - minY + 1 };
}

/** Keeps components of at least `minArea` px (always the largest); returns kept and dropped. */
export function splitSpecks(components: Component[], minArea: number) {
  const largest = components.reduce((a, b) => (b.area > a.area ? b : a));
  const kept = components.filter((c) => c === largest || c.area >= minArea);
  const keptLabels = new Set(kept.map((c) => c.label));
  const droppedLabels = new Set(components.filter((c) => !keptLabels.has(c.label)).map((c) => c.label));
  return { kept, dropped: droppedLabels.size, droppedLabels };
}

/**
 * Widens the narrow places the checks would warn about (a waist or a thin part under the smallest
 * feature): art is added around the part of the cut shape thinner than the bridge width that holds
 * each one (what an opening by it removes) until it is that wide, and a closing by the smallest
 * feature then rounds the crevices where the widened part meets the rest. Changes `artMask` in place;
 * answers how many parts were widened (the caller grows the border again when any were).
 */
export function widenNarrowParts(
  artMask: Uint8Array,
  grown: Uint8Array,
  cw: number,
  ch: number,
  at: { minFeaturePx: number; bridgePx: number; level: number },
): number {
  const { minFeaturePx, bridgePx, level } = at;
  const filledGrown = fillHoles(grown, cw, ch);
  const narrow = [
    ...findNecks(filledGrown, cw, ch, minFeaturePx),
    ...(level >= minFeaturePx / 2 ? [] : findNarrowParts(filledGrown, cw, ch, minFeaturePx)),
  ];
  const residue = narrow.length ? thinResidue(grown, cw, ch, bridgePx / 2) : null;
  const pieces = residue ? labelComponents(residue, cw, ch) : null;
  const slack = Math.ceil(minFeaturePx) + 1;
  const holding = new Set<number>();
  for (const n of pieces ? narrow : []) {
    // The residue component at (or within the smallest feature of) the narrow place.
    for (let dy = -slack; dy <= slack; dy++) {
      for (let dx = -slack; dx <= slack; dx++) {
        const x = Math.floor(n.x) + dx,
          y = Math.floor(n.y) + dy;
        if (x >= 0 && y >= 0 && x < cw && y < ch && pieces!.labels[y * cw + x] > 0 && residue![y * cw + x])
          holding.add(pieces!.labels[y * cw + x]);
      }
    }
  }
  const thin = holding.size;
  if (!residue || thin === 0) return 0;
  const target = new Uint8Array(cw * ch);
  for (let i = 0; i < target.length; i++) if (residue[i] && holding.has(pieces!.labels[i])) target[i] = 1;
  const reach = distanceTransform(target, cw, ch);
  const grow = Math.max(1, bridgePx / 2 - (level - 0.5) + 1);
  for (let i = 0; i < artMask.length; i++) if (reach[i] <= grow) artMask[i] = 1;
  // Closing by a disc of the smallest feature, only around what was added: no new slots.
  const rc = Math.max(1, minFeaturePx);
  const toArt = distanceTransform(artMask, cw, ch);
  const dilated = new Uint8Array(cw * ch);
  for (let i = 0; i < dilated.length; i++) dilated[i] = toArt[i] <= rc ? 0 : 1; // the outside of the dilation
  const toOutside = distanceTransform(dilated, cw, ch);
  for (let i = 0; i < artMask.length; i++) if (!artMask[i] && toOutside[i] > rc && reach[i] <= grow + 2 * rc) artMask[i] = 1;
  return thin;
}

/**
 * Labels art pixels by the part of the sticker they belong to (1..count): the components of the
 * grown shape eroded by `r` px, merged where one connected piece of art spans several (a piece of
 * art's own thin waist is the maker's drawing, warned about, not bridged unless asked).
 */
export function joinParts(
  artMask: Uint8Array,
  grown: Uint8Array,
  width: number,
  height: number,
  r: number,
): { labels: Int32Array; count: number } {
  const eroded = erode(grown, width, height, r);
  const er = labelComponents(eroded, width, height);
  const art = labelComponents(artMask, width, height);
  const E = er.components.length;
  const parent = Int32Array.from({ length: E + art.components.length + 1 }, (_, i) => i);
  const find = (a: number): number => (parent[a] === a ? a : (parent[a] = find(parent[a])));
  const union = (a: number, b: number) => {
    const ra = find(a),
      rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  for (let i = 0; i < artMask.length; i++) if (artMask[i] && er.labels[i] > 0) union(er.labels[i], E + art.labels[i]);
  const ids = new Map<number, number>();
  const labels = new Int32Array(artMask.length);
  for (let i = 0; i < artMask.length; i++) {
    if (!artMask[i]) continue;
    const root = find(E + art.labels[i]);
    if (!ids.has(root)) ids.set(root, ids.size + 1);
    labels[i] = ids.get(root)!;
  }
  return { labels, count: ids.size };
}
