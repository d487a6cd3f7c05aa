/**
 * Ink coverage of an RGBA image printed on white paper, as ink amounts per channel (0–1) and their
 * sum. Each pixel is laid over white, turned into cyan, magenta and yellow (1 − R, 1 − G, 1 − B)
 * and the grey they share moved to black (full grey-component replacement), so solid black is one
 * full layer of black ink. The sum is the total area coverage printers speak of (up to 4 = 400 %);
 * a fully covered sheet is 1, one full layer.
 */
export type Coverage = { c: number; m: number; y: number; k: number; total: number };

export function inkCoverage(rgba: Uint8Array | Buffer, pixels: number): Coverage {
  let c = 0,
    m = 0,
    y = 0,
    k = 0;
  for (let i = 0; i < pixels; i++) {
    const a = rgba[i * 4 + 3] / 255;
    if (a === 0) continue;
    const pc = (a * (255 - rgba[i * 4])) / 255,
      pm = (a * (255 - rgba[i * 4 + 1])) / 255,
      py = (a * (255 - rgba[i * 4 + 2])) / 255;
    const pk = Math.min(pc, pm, py);
    c += pc - pk;
    m += pm - pk;
    y += py - pk;
    k += pk;
  }
  const n = Math.max(1, pixels);
  return { c: c / n, m: m / n, y: y / n, k: k / n, total: (c + m + y + k) / n };
}
