// Exact Euclidean distance transform in linear time: Felzenszwalb & Huttenlocher, "Distance
// Transforms of Sampled Functions", Theory of Computing 8 (2012). For a binary feature image the
// first (column) phase is the 1-D distance to the nearest feature in the column, computed by a
// forward and a backward sweep over whole rows (cache-friendly); the second (row) phase is the
// lower envelope of parabolas on each row. Distances run between pixel centres.

const INF = 1e20;

function envelope1d(f: Float64Array, n: number, d: Float64Array, v: Int32Array, z: Float64Array) {
  let k = 0;
  v[0] = 0;
  z[0] = -INF;
  z[1] = INF;
  for (let q = 1; q < n; q++) {
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
    d[q] = dq * dq + f[v[k]];
  }
}

/** Squared distance (px²) from each pixel to the nearest pixel where `feature` is non-zero. */
export function squaredDistanceTransform(feature: Uint8Array, width: number, height: number): Float64Array {
  const out = new Float64Array(width * height);
  // Column phase: vertical distance to the nearest feature, top-down then bottom-up sweeps.
  const far = width + height;
  for (let x = 0; x < width; x++) out[x] = feature[x] ? 0 : far;
  for (let y = 1; y < height; y++) {
    const row = y * width,
      prev = row - width;
    for (let x = 0; x < width; x++) out[row + x] = feature[row + x] ? 0 : out[prev + x] + 1;
  }
  for (let y = height - 2; y >= 0; y--) {
    const row = y * width,
      next = row + width;
    for (let x = 0; x < width; x++) if (out[next + x] + 1 < out[row + x]) out[row + x] = out[next + x] + 1;
  }
  for (let i = 0; i < out.length; i++) out[i] = out[i] >= far ? INF : out[i] * out[i];
  // Row phase: lower envelope of parabolas.
  const f = new Float64Array(width),
    d = new Float64Array(width),
    z = new Float64Array(width + 1);
  const v = new Int32Array(width);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) f[x] = out[row + x];
    envelope1d(f, width, d, v, z);
    out.set(d, row);
  }
  return out;
}

/** Euclidean distance (px) to the nearest feature pixel. */
export function distanceTransform(feature: Uint8Array, width: number, height: number): Float64Array {
  const sq = squaredDistanceTransform(feature, width, height);
  for (let i = 0; i < sq.length; i++) sq[i] = Math.sqrt(sq[i]);
  return sq;
}
