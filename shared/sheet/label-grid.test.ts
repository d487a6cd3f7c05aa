// The label grid on the common-practice print area (6.75 × 9.25 in, TRADE.md) with its 1/8 in
// margin: counts and pitch worked by hand, every label on the pitch within 0.01 in.
import { describe, expect, it } from 'vitest';
import { applyDiff } from './commands';
import { emptyDocument } from './document';
import type { Piece } from './document';
import { LABEL_GRID_ALLOWANCE_MM, labelGrid } from './label-grid';

const IN = 25.4;
const doc = { ...emptyDocument({ areaWidthMm: 6.75 * IN, areaHeightMm: 9.25 * IN, safeMarginMm: 0.125 * IN, minGapMm: 0.125 * IN }) };
const label: Piece = {
  id: 'l',
  artId: 'a',
  x: 50,
  y: 50,
  rotation: 0,
  width: 1.75 * IN,
  border: 0.125 * IN,
  borderColour: '#ffffff',
  locked: false,
};

describe('label grid', () => {
  it('fills 6.5 × 9 in of usable area with 2 × 0.75 in labels at a 1/8 in gap: 3 across, 10 down, pitch 2.125 × 0.875 in', () => {
    // Across: 3 × 2 + 2 × 0.125 = 6.25 ≤ 6.5 < 4 × 2 + 3 × 0.125. Down: 10 × 0.75 + 9 × 0.125 = 8.625 ≤ 9 < 11 × 0.75 + 10 × 0.125.
    const grid = labelGrid({ ...doc, pieces: [label] }, label, 2 * IN, 0.75 * IN, 0.125 * IN)!;
    expect([grid.columns, grid.rows]).toEqual([3, 10]);
    const allowance = LABEL_GRID_ALLOWANCE_MM / IN; // 0.002 in, so traced cut lines stay a full gap apart
    expect(grid.pitchX / IN).toBeCloseTo(2.125 + allowance, 10);
    expect(grid.pitchY / IN).toBeCloseTo(0.875 + allowance, 10);
    const after = applyDiff({ ...doc, pieces: [label] }, grid.command.diff);
    expect(after.pieces).toHaveLength(30);
    const xs = [...new Set(after.pieces.map((p) => Math.round(p.x * 1000)))].sort((a, b) => a - b).map((v) => v / 1000);
    const ys = [...new Set(after.pieces.map((p) => Math.round(p.y * 1000)))].sort((a, b) => a - b).map((v) => v / 1000);
    for (let i = 1; i < xs.length; i++) expect(Math.abs(xs[i] - xs[i - 1] - 2.125 * IN)).toBeLessThan(0.01 * IN);
    for (let j = 1; j < ys.length; j++) expect(Math.abs(ys[j] - ys[j - 1] - 0.875 * IN)).toBeLessThan(0.01 * IN);
    // Centred: the same room left and right of the grid, about (6.75 − 6.25) / 2 = 0.25 in from the area's edges.
    expect(xs[0] - IN).toBeCloseTo(6.75 * IN - (xs[2] + IN), 9);
    expect((xs[0] - IN) / IN).toBeCloseTo(0.25 - allowance, 6);
    expect(new Set(after.pieces.map((p) => p.id)).size).toBe(30);
    expect(after.pieces.every((p) => p.artId === 'a' && p.width === label.width)).toBe(true);
  });

  it('answers nothing when not even one label fits inside the margin', () => {
    expect(labelGrid({ ...doc, pieces: [label] }, label, 7 * IN, 1 * IN, 0.125 * IN)).toBeNull();
  });
});
