// Erosion and dilation by a Euclidean disk, exactly as thresholding a distance transform would give
// them, but computed only where they can change anything: around the edge of the set. A pixel lies
// within R of the set exactly when it lies within R of one of the set's edge pixels (those with a
// pixel outside the set among their 8 neighbours): from any set pixel within R, stepping toward the
// pixel leaves the set through an edge pixel that is closer still. So a disk is stamped, row run by
// row run, around each edge pixel; the cost grows with the edge's length, not the canvas's area.

/** For each row offset dy of a disk of radius R (dy from -R to R), the largest |dx| inside it. */
function diskRows(radius: number, inclusive: boolean): { reach: Int32Array; rows: number } {
  const r2 = radius * radius;
  const rows = Math.floor(radius);
  const reach = new Int32Array(2 * rows + 1);
  for (let dy = -rows; dy <= rows; dy++) {
    let dx = Math.floor(Math.sqrt(Math.max(0, r2 - dy * dy)));
    // Settle rounding in the square root against the exact integer test.
    while (dx >= 0 && (inclusive ? dx * dx + dy * dy > r2 : dx * dx + dy * dy >= r2)) dx--;
    while (inclusive ? (dx + 1) * (dx + 1) + dy * dy <= r2 : (dx + 1) * (dx + 1) + dy * dy < r2) dx++;
    reach[dy + rows] = dx;
  }
  return { reach, rows };
}

/**
 * The pixels within `radius` of the set (distance between pixel centres below it, or at most it when
 * `inclusive`), the set itself included.
 */
export function nearSet(set: Uint8Array, width: number, height: number, radius: number, inclusive: boolean): Uint8Array {
  const out = Uint8Array.from(set);
  const { reach, rows } = diskRows(radius, inclusive);
  // unsetNear[x]: some pixel of rows y-1..y+1 in column x is not in the set.
  const unsetNear = new Uint8Array(width + 2);
  for (let y = 0; y < height; y++) {
    const row = y * width,
      up = y > 0 ? row - width : row,
      down = y < height - 1 ? row + width : row;
    for (let x = 0; x < width; x++) unsetNear[x + 1] = set[up + x] & set[row + x] & set[down + x] ? 0 : 1;
    for (let x = 0; x < width; x++) {
      // An edge pixel: in the set, with some 8-neighbour inside the canvas not in it.
      if (!set[row + x] || !(unsetNear[x] | unsetNear[x + 1] | unsetNear[x + 2])) continue;
      const y0 = Math.max(0, y - rows),
        y1 = Math.min(height - 1, y + rows);
      for (let sy = y0; sy <= y1; sy++) {
        const dx = reach[sy - y + rows];
        if (dx < 0) continue;
        out.fill(1, sy * width + Math.max(0, x - dx), sy * width + Math.min(width - 1, x + dx) + 1);
      }
    }
  }
  return out;
}
