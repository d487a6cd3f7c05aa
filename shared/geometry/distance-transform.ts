// Exact Euclidean distance transform in linear time: Felzenszwalb & Huttenlocher, "Distance
// Transforms of Sampled Functions", Theory of Computing 8 (2012). For a binary feature image the
// first (column) phase is the 1-D distance to the nearest feature in the column, computed by a
// forward and a backward sweep over whole rows (cache-friendly); the second (row) phase is the
// lower envelope of parabolas on each row. Distances run between pixel centres.

const INF = 1e20;

/**
 * The lower envelope of the parabolas (x − s)² + f(s) over the sites s (increasing), evaluated at
 * every x of the row into out[offset + x]. `v` and `z` are scratch (sites, boundaries).
 */
function envelope(
  f: Float64Array,
  sites: Int32Array,
  count: number,
  n: number,
  out: Float32Array,
  offset: number,
  v: Int32Array,
  z: Float64Array,
) {
  let k = 0;
  v[0] = sites[0];
  z[0] = -INF;
  z[1] = INF;
  for (let j = 1; j < count; j++) {
    const q = sites[j];
    const fq = f[q] + q * q;
    let s = (fq - (f[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
    while (s <= z[k]) {
      k--;
      s = (fq - (f[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
    }
    k++;
    v[k] = q;
    z[k] = s;
    z[k + 1] = INF;
  }
  k = 0;
  for (let q = 0; q < n; q++) {
    while (z[k + 1] < q) k++;
    const dq = q - v[k];
    out[offset + q] = dq * dq + f[v[k]];
  }
}

/**
 * Squared distance (px²) from each pixel to the nearest pixel where `feature` is non-zero (1e20
 * where there is none). The values are whole numbers; Float32 holds them exactly below 2²⁴ (a
 * reach of 4,096 px), far past any border width, and beyond that to its precision.
 */
export function squaredDistanceTransform(
  feature: Uint8Array,
  width: number,
  height: number,
  out: Float32Array = new Float32Array(width * height), // every value is written
  reach = Infinity, // distances up to it are exact; a pixel farther from every feature gets more than reach²
): Float32Array {
  // Column phase: vertical distance to the nearest feature, top-down then bottom-up sweeps, in
  // whole numbers written through an integer view of the same memory (each row is read in full by
  // the row phase before it writes that row's squared distances as floats).
  const far = width + height;
  const g = new Int32Array(out.buffer, out.byteOffset, width * height);
  for (let x = 0; x < width; x++) g[x] = feature[x] ? 0 : far;
  for (let y = 1; y < height; y++) {
    const row = y * width,
      prev = row - width;
    for (let x = 0; x < width; x++) g[row + x] = feature[row + x] ? 0 : g[prev + x] + 1;
  }
  for (let y = height - 2; y >= 0; y--) {
    const row = y * width,
      next = row + width;
    for (let x = 0; x < width; x++) {
      const below = g[next + x] + 1;
      if (below < g[row + x]) g[row + x] = below;
    }
  }
  // Row phase: lower envelope of the parabolas of the columns that have a feature. A site strictly
  // inside a run of zeros is never the nearest for any pixel outside that run (the run's ends are
  // nearer on the same row), and the run's own pixels are 0: such sites are left out.
  // A column's feature farther than `reach` down or up the column is farther than that from every
  // pixel of this row: it is never the nearest within reach, and is left out.
  const limit = Math.min(far - 1, reach);
  const f = new Float64Array(width),
    z = new Float64Array(width + 1);
  const v = new Int32Array(width),
    sites = new Int32Array(width),
    zeros = new Int32Array(width);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    let count = 0,
      inner = 0;
    for (let x = 0; x < width; x++) {
      const gx = g[row + x];
      if (gx > limit) continue;
      if (gx === 0 && x > 0 && x < width - 1 && g[row + x - 1] === 0 && g[row + x + 1] === 0) {
        zeros[inner++] = x;
        continue;
      }
      f[x] = gx * gx;
      sites[count++] = x;
    }
    if (count === 0) {
      out.fill(INF, row, row + width);
      continue;
    }
    envelope(f, sites, count, width, out, row, v, z);
    for (let k = 0; k < inner; k++) out[row + zeros[k]] = 0;
  }
  return out;
}

/** Euclidean distance (px) to the nearest feature pixel. */
export function distanceTransform(feature: Uint8Array, width: number, height: number): Float32Array {
  const sq = squaredDistanceTransform(feature, width, height);
  for (let i = 0; i < sq.length; i++) sq[i] = Math.sqrt(sq[i]);
  return sq;
}
