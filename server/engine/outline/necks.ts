import { labelComponents } from './components';
import { distanceTransform } from '../../../shared/geometry/distance-transform';

/**
 * Finds parts of a filled shape narrower than `minWidth` px: what a morphological opening with a
 * disk of that diameter removes (opening = union of disks centred where the inner distance is at
 * least the radius). Leftover pieces bigger than radius² px are reported; smaller ones are the
 * rounding of ordinary corners. Returns the centres (px) of the narrow parts found.
 */
export function findNarrowParts(filled: Uint8Array, width: number, height: number, minWidth: number): Array<{ x: number; y: number; area: number }> {
  const r = minWidth / 2;
  if (r < 1) return [];
  const outside = new Uint8Array(filled.length);
  for (let i = 0; i < filled.length; i++) outside[i] = filled[i] ? 0 : 1;
  // Distances run between pixel centres; the +0.5 puts them on the pixel edge the cut follows.
  const inner = distanceTransform(outside, width, height);
  const centres = new Uint8Array(filled.length);
  for (let i = 0; i < filled.length; i++) centres[i] = filled[i] && inner[i] - 0.5 >= r ? 1 : 0;
  const reach = distanceTransform(centres, width, height);
  const residue = new Uint8Array(filled.length);
  let any = false;
  for (let i = 0; i < filled.length; i++) {
    if (filled[i] && reach[i] > r + 0.5) {
      residue[i] = 1;
      any = true;
    }
  }
  if (!any) return [];
  const { components } = labelComponents(residue, width, height);
  return components
    .filter((c) => c.area > r * r)
    .map((c) => ({ x: (c.minX + c.maxX + 1) / 2, y: (c.minY + c.maxY + 1) / 2, area: c.area }));
}
