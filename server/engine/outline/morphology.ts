// Erosion and dilation by a Euclidean disk, exactly as thresholding a distance transform would give
// them, computed on the set's runs (see runs.ts): the cost grows with the runs and the disk's height,
// not with the canvas's area.
import { dilateRuns, maskOfRuns, runsOfMask } from './runs';

/**
 * The pixels within `radius` of the set (distance between pixel centres below it, or at most it when
 * `inclusive`), the set itself included.
 */
export function nearSet(set: Uint8Array, width: number, height: number, radius: number, inclusive: boolean): Uint8Array {
  return maskOfRuns(dilateRuns(runsOfMask(set, width, height), radius, inclusive));
}
