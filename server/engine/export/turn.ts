// Drawing a sticker turned by any angle straight onto the print raster: for each print pixel the
// turned sticker covers, its centre is mapped back into the sticker (the inverse of the placement's
// clockwise turn, shared/sheet/placement.ts) and sampled bilinearly with alpha-weighted colours
// (premultiplied interpolation, so transparent neighbours add no dark fringe), then laid over what
// is there with Porter–Duff "source over" (Porter & Duff, "Compositing Digital Images", 1984).
// Only the span of each row that maps inside the sticker is visited.

type Rgba = { data: Uint8Array; width: number; height: number };

/**
 * Lays `src` over `dst`, turned clockwise by `degrees` about its centre, with that centre at
 * (cx, cy) in `dst` pixels (pixel edges: pixel (x, y) covers [x, x+1] × [y, y+1]). Quarter turns
 * land exactly on the pixel grid when the caller snaps the centre (see snapCentre).
 */
export function drawTurned(dst: Rgba, src: Rgba, cx: number, cy: number, degrees: number) {
  const quarter = degrees % 90 === 0;
  const a = (degrees * Math.PI) / 180;
  const cos = quarter ? Math.round(Math.cos(a)) : Math.cos(a),
    sin = quarter ? Math.round(Math.sin(a)) : Math.sin(a);
  const sw = src.width,
    sh = src.height,
    s = src.data,
    d = dst.data,
    dw = dst.width;
  const halfW = (Math.abs(cos) * sw + Math.abs(sin) * sh) / 2 + 1,
    halfH = (Math.abs(sin) * sw + Math.abs(cos) * sh) / 2 + 1;
  const y0 = Math.max(0, Math.floor(cy - halfH)),
    y1 = Math.min(dst.height - 1, Math.ceil(cy + halfH));
  const xMin = Math.max(0, Math.floor(cx - halfW)),
    xMax = Math.min(dw - 1, Math.ceil(cx + halfW));
  // Sample coordinates (source pixel centres at integers): fx = u − 0.5 with u = cos·dx + sin·dy + sw/2.
  for (let y = y0; y <= y1; y++) {
    const dy = y + 0.5 - cy;
    // fx(x) = ax + cos·x, fy(x) = ay − sin·x; keep x where both lie in (−1, sw) × (−1, sh).
    const ax = cos * (0.5 - cx) + sin * dy + sw / 2 - 0.5,
      ay = -sin * (0.5 - cx) + cos * dy + sh / 2 - 0.5;
    let lo = xMin,
      hi = xMax;
    [lo, hi] = clampSpan(lo, hi, ax, cos, -1, sw);
    [lo, hi] = clampSpan(lo, hi, ay, -sin, -1, sh);
    for (let x = lo; x <= hi; x++) {
      const fx = ax + cos * x,
        fy = ay - sin * x;
      // fx, fy > −1 here, so truncating fx + 1 floors fx.
      const ix = ((fx + 1) | 0) - 1,
        iy = ((fy + 1) | 0) - 1;
      const tx = fx - ix,
        ty = fy - iy;
      let A = 0,
        R = 0,
        G = 0,
        B = 0;
      if (ix >= 0 && iy >= 0 && ix + 1 < sw && iy + 1 < sh) {
        // All four taps inside the sticker (most pixels): unrolled.
        const i00 = (iy * sw + ix) * 4,
          i10 = i00 + 4,
          i01 = i00 + sw * 4,
          i11 = i01 + 4;
        const a00 = s[i00 + 3],
          a10 = s[i10 + 3],
          a01 = s[i01 + 3],
          a11 = s[i11 + 3];
        if ((a00 | a10 | a01 | a11) === 0) continue;
        if ((a00 & a10 & a01 & a11) === 255) {
          // Opaque all round (the sticker's inside): plain bilinear colour, nothing under it shows.
          const w00 = (1 - tx) * (1 - ty),
            w10 = tx * (1 - ty),
            w01 = (1 - tx) * ty,
            w11 = tx * ty;
          const o = (y * dw + x) * 4;
          d[o] = (w00 * s[i00] + w10 * s[i10] + w01 * s[i01] + w11 * s[i11] + 0.5) | 0;
          d[o + 1] = (w00 * s[i00 + 1] + w10 * s[i10 + 1] + w01 * s[i01 + 1] + w11 * s[i11 + 1] + 0.5) | 0;
          d[o + 2] = (w00 * s[i00 + 2] + w10 * s[i10 + 2] + w01 * s[i01 + 2] + w11 * s[i11 + 2] + 0.5) | 0;
          d[o + 3] = 255;
          continue;
        }
        const w00 = (1 - tx) * (1 - ty) * a00,
          w10 = tx * (1 - ty) * a10,
          w01 = (1 - tx) * ty * a01,
          w11 = tx * ty * a11;
        A = w00 + w10 + w01 + w11;
        R = w00 * s[i00] + w10 * s[i10] + w01 * s[i01] + w11 * s[i11];
        G = w00 * s[i00 + 1] + w10 * s[i10 + 1] + w01 * s[i01 + 1] + w11 * s[i11 + 1];
        B = w00 * s[i00 + 2] + w10 * s[i10 + 2] + w01 * s[i01 + 2] + w11 * s[i11 + 2];
      } else {
        // At the sticker's edge: the taps outside it are transparent.
        for (let k = 0; k < 4; k++) {
          const px = ix + (k & 1),
            py = iy + (k >> 1);
          const w = (k & 1 ? tx : 1 - tx) * (k >> 1 ? ty : 1 - ty);
          if (w === 0 || px < 0 || py < 0 || px >= sw || py >= sh) continue;
          const i = (py * sw + px) * 4;
          const wa = w * s[i + 3];
          A += wa;
          R += wa * s[i];
          G += wa * s[i + 1];
          B += wa * s[i + 2];
        }
      }
      if (A < 0.5) continue;
      const o = (y * dw + x) * 4;
      const under = d[o + 3];
      if (A >= 254.5 || under === 0) {
        d[o] = (R / A + 0.5) | 0;
        d[o + 1] = (G / A + 0.5) | 0;
        d[o + 2] = (B / A + 0.5) | 0;
        d[o + 3] = (A + 0.5) | 0;
        continue;
      }
      // Source over a partly covered pixel: colours weighted by their coverage.
      const keep = (under * (255 - A)) / 255;
      const out = A + keep;
      d[o] = ((R + d[o] * keep) / out + 0.5) | 0;
      d[o + 1] = ((G + d[o + 1] * keep) / out + 0.5) | 0;
      d[o + 2] = ((B + d[o + 2] * keep) / out + 0.5) | 0;
      d[o + 3] = (out + 0.5) | 0;
    }
  }
}

/** Narrows [lo, hi] to the x where start + step·x lies strictly between min and max. */
function clampSpan(lo: number, hi: number, start: number, step: number, min: number, max: number): [number, number] {
  if (Math.abs(step) < 1e-12) return start > min && start < max ? [lo, hi] : [1, 0];
  const a = (min - start) / step,
    b = (max - start) / step;
  const from = Math.min(a, b),
    to = Math.max(a, b);
  return [Math.max(lo, Math.floor(from) + 1), Math.min(hi, Math.ceil(to) - 1)];
}

/**
 * For quarter turns, the centre moved (by under half a pixel) so the turned sticker's pixels land
 * exactly on print pixels and are copied, not resampled; any other angle keeps the exact centre.
 */
export function snapCentre(cx: number, cy: number, width: number, height: number, degrees: number) {
  if (degrees % 90 !== 0) return { cx, cy };
  const across = (((degrees % 360) + 360) % 360) % 180 === 0 ? width : height;
  const down = across === width ? height : width;
  return { cx: Math.round(cx - across / 2) + across / 2, cy: Math.round(cy - down / 2) + down / 2 };
}
