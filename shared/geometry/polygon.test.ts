import { describe, expect, it } from 'vitest';
import { area, clockwise, isSimple, perimeter, ringToSvgPath, signedArea } from './polygon';

const square = [
  { x: 0, y: 0 },
  { x: 10, y: 0 },
  { x: 10, y: 10 },
  { x: 0, y: 10 },
];

describe('polygon helpers', () => {
  it('measures a 10 × 10 square: area 100, perimeter 40 (handbook formulas)', () => {
    expect(area(square)).toBe(100);
    expect(perimeter(square)).toBe(40);
  });

  it('calls a ring clockwise on screen (y down) positive and normalises to it', () => {
    expect(signedArea(square)).toBe(100); // right, then down, then left: clockwise on screen
    expect(signedArea(clockwise([...square].reverse()))).toBe(100);
  });

  it('tells a simple ring from a bow-tie', () => {
    expect(isSimple(square)).toBe(true);
    const bowTie = [
      { x: 0, y: 0 },
      { x: 10, y: 10 },
      { x: 10, y: 0 },
      { x: 0, y: 10 },
    ];
    expect(isSimple(bowTie)).toBe(false);
    // A ring that touches itself at one vertex is not simple either.
    const touching = [
      { x: 0, y: 0 },
      { x: 4, y: 0 },
      { x: 2, y: 2 },
      { x: 4, y: 4 },
      { x: 0, y: 4 },
      { x: 2, y: 2 },
    ];
    expect(isSimple(touching)).toBe(false);
  });

  it('writes closed SVG path data', () => {
    expect(ringToSvgPath(square)).toBe('M0 0L10 0L10 10L0 10Z');
  });
});
