import { describe, expect, it } from 'vitest';
import { dpiToPixelsPerMetre, formatFineLength, formatLength, inchToMm, mmToInch, mmToPixels, parseLength, toMm } from './index';

describe('units', () => {
  it('uses the exact inch: 1 in = 25.4 mm (international yard and pound agreement, 1959)', () => {
    expect(inchToMm(1)).toBe(25.4);
    expect(mmToInch(25.4)).toBe(1);
    // Common practice print-and-cut area: 6.75 × 9.25 in = 171.45 × 234.95 mm
    expect(inchToMm(6.75)).toBeCloseTo(171.45, 10);
    expect(inchToMm(9.25)).toBeCloseTo(234.95, 10);
  });

  it('gives 11811 px/m for 300 DPI (PNG spec §11.3.5.3, pHYs unit = metre)', () => {
    expect(dpiToPixelsPerMetre(300)).toBe(11811);
    expect(dpiToPixelsPerMetre(150)).toBe(5906);
  });

  it('rounds printed size to whole pixels: 6.75 in at 300 DPI = 2025 px', () => {
    expect(mmToPixels(inchToMm(6.75), 300)).toBe(2025);
    expect(mmToPixels(inchToMm(9.25), 300)).toBe(2775);
  });

  it('parses lengths with units and refuses garbage', () => {
    expect(parseLength('2in')).toBeCloseTo(50.8, 10);
    expect(parseLength('3 mm')).toBe(3);
    expect(parseLength('0.5"')).toBeCloseTo(12.7, 10);
    expect(parseLength('1.2cm')).toBeCloseTo(12, 10);
    expect(parseLength('4', 'in')).toBeCloseTo(101.6, 10);
    expect(parseLength('two inches')).toBeNull();
    expect(toMm(0.125, 'in')).toBeCloseTo(3.175, 10);
  });

  it('formats in the user unit', () => {
    expect(formatLength(50.8, 'in')).toBe('2 in');
    expect(formatLength(3.175, 'mm')).toBe('3.2 mm');
    // Small lengths: not "0.039 in" for 1 mm.
    expect(formatFineLength(1, 'in')).toBe('0.04 in (1 mm)');
    expect(formatFineLength(0.5, 'in')).toBe('0.02 in (0.5 mm)');
    expect(formatFineLength(3.175, 'in')).toBe('0.125 in');
    expect(formatFineLength(1, 'mm')).toBe('1 mm');
  });
});
