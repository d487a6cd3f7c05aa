import { boundaryPixels, closestPair } from './bridge';
import { labelRowRuns } from './components';
import type { RowRuns } from './runs';
import { complementRuns, dilateRuns, erodeRuns, maskOfRuns, placeRuns, runsArea, runsOfMask, subtractRuns } from './runs';

/**
 * Finds parts of a filled shape narrower than `minWidth` px: what a morphological opening with a
 * disk of that diameter removes (opening = union of disks centred where the inner distance is at
 * least the radius). Leftover pieces bigger than radius² px are reported; smaller ones are the
 * rounding of ordinary corners. Returns the centres (px) of the narrow parts found.
 */
export function findNarrowParts(
  filled: Uint8Array,
  width: number,
  height: number,
  minWidth: number,
): Array<{ x: number; y: number; area: number; box: { minX: number; minY: number; maxX: number; maxY: number } }> {
  return narrowPartsOf(runsOfMask(filled, width, height), minWidth);
}

export function narrowPartsOf(filled: RowRuns, minWidth: number) {
  const r = minWidth / 2;
  if (r < 1) return [];
  const residue = thinResidueRuns(filled, r);
  if (runsArea(residue) === 0) return [];
  return labelRowRuns(residue)
    .components.filter((c) => c.area > r * r)
    .map((c) => ({
      x: (c.minX + c.maxX + 1) / 2,
      y: (c.minY + c.maxY + 1) / 2,
      area: c.area,
      box: { minX: c.minX, minY: c.minY, maxX: c.maxX, maxY: c.maxY },
    }));
}

/** The pixels of a filled shape an opening by a disk of radius `r` px removes; null when none. */
export function thinResidue(filled: Uint8Array, width: number, height: number, r: number): Uint8Array | null {
  const residue = thinResidueRuns(runsOfMask(filled, width, height), r);
  return runsArea(residue) > 0 ? maskOfRuns(residue) : null;
}

function thinResidueRuns(filled: RowRuns, r: number): RowRuns {
  // The opening's centres: what an inward offset by r leaves; it covers whatever lies within
  // r of them (distances between pixel centres; the +0.5 puts them on the pixel edge the cut follows).
  const centres = erodeRuns(filled, r);
  return subtractRuns(filled, dilateRuns(centres, r + 0.5, true));
}

/** What an inward offset by `r` px leaves of a filled shape (distances measured to the pixel edge). */
export function erode(filled: Uint8Array, width: number, height: number, r: number): Uint8Array {
  return maskOfRuns(erodeRuns(runsOfMask(filled, width, height), r));
}

/**
 * Necks narrower than `minWidth` px: places where an inward offset by half that width splits the
 * shape in two (the narrowest width of a shape is where its erosion first disconnects). Each neck is
 * reported at the midpoint between the closest points of the parts it separates. Parts smaller than
 * r² px are the erosion's rounding, not parts.
 */
export function findNecks(filled: Uint8Array, width: number, height: number, minWidth: number): Array<{ x: number; y: number }> {
  return necksOf(runsOfMask(filled, width, height), minWidth);
}

export function necksOf(filled: RowRuns, minWidth: number): Array<{ x: number; y: number }> {
  const { width, height } = filled;
  const r = minWidth / 2;
  if (r < 1) return [];
  const erodedRuns = erodeRuns(filled, r);
  const { components, runs } = labelRowRuns(erodedRuns);
  const kept = components.filter((c) => c.area > r * r);
  if (kept.length < 2) return [];
  // Rare (a neck is there): the pixels are needed to find the closest points across it.
  const eroded = maskOfRuns(erodedRuns);
  const labels = new Int32Array(width * height);
  for (let i = 0; i < runs.count; i++) labels.fill(runs.label[i], runs.y[i] * width + runs.x0[i], runs.y[i] * width + runs.x1[i] + 1);
  const index = new Map(kept.map((c, i) => [c.label, i + 1]));
  const groupLabels = new Int32Array(labels.length);
  for (let i = 0; i < labels.length; i++) groupLabels[i] = index.get(labels[i]) ?? 0;
  const boundary = boundaryPixels(groupLabels, eroded, width, height, kept.length);
  // A spanning tree of closest pairs: one neck per join the erosion undid.
  const inTree = new Set([0]);
  const necks: Array<{ x: number; y: number }> = [];
  while (inTree.size < kept.length) {
    let best: { p: { x: number; y: number }; q: { x: number; y: number }; d2: number; g: number } | null = null;
    for (const t of inTree) {
      for (let g = 0; g < kept.length; g++) {
        if (inTree.has(g) || !boundary[g].length || !boundary[t].length) continue;
        const pair = closestPair(boundary[t], boundary[g]);
        if (!best || pair.d2 < best.d2) best = { ...pair, g };
      }
    }
    if (!best) break;
    inTree.add(best.g);
    necks.push({ x: (best.p.x + best.q.x + 1) / 2, y: (best.p.y + best.q.y + 1) / 2 });
  }
  return necks;
}

/** Slots and notches narrower than `minWidth` px: thin parts of the outside reaching into the shape. */
export function slotsOf(inner: RowRuns, minWidth: number): Array<{ x: number; y: number; area: number }> {
  const { width, height } = inner;
  // The outside goes on past the canvas: pad it, so the strip between the shape and the canvas
  // edge is not taken for a slot.
  const m = Math.ceil(minWidth) + 2;
  const padded = placeRuns(inner, m, m, width + 2 * m, height + 2 * m);
  return narrowPartsOf(complementRuns(padded), minWidth).map((p) => ({ ...p, x: p.x - m, y: p.y - m }));
}
