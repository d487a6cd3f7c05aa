// Physical units. Sizes are stored in millimetres; conversion happens only at the edges
// (input fields, rendering, export). 1 in = 25.4 mm exactly (international yard and pound
// agreement, 1959); CSS/SVG: 1in = 96px = 72pt (CSS Values and Units Level 3, §6.2).

/** Names that say which unit a number is in (plain numbers: every length in the app is in mm). */
type Mm = number;
type Inch = number;
type Px = number;

export type LengthUnit = 'mm' | 'in';
export const LENGTH_UNITS: readonly LengthUnit[] = ['in', 'mm'];

export const MM_PER_INCH = 25.4;

/** An angle in degrees brought into [0, 360): -90 → 270, 450 → 90. */
export const normaliseDegrees = (degrees: number) => ((degrees % 360) + 360) % 360;
const CSS_PX_PER_INCH = 96;

export const inchToMm = (value: Inch): Mm => value * MM_PER_INCH;
export const mmToInch = (value: Mm): Inch => value / MM_PER_INCH;

export function toMm(value: number, unit: LengthUnit): Mm {
  return unit === 'mm' ? value : inchToMm(value);
}

export function fromMm(value: Mm, unit: LengthUnit): number {
  return unit === 'mm' ? value : mmToInch(value);
}

/** Pixels needed to print `length` at `dpi` dots per inch, rounded to whole pixels. */
export function mmToPixels(length: Mm, dpi: number): Px {
  return Math.round((length / MM_PER_INCH) * dpi);
}

/** PNG pHYs pixels per metre for a DPI (PNG spec §11.3.5.3, unit 1 = metre). */
export function dpiToPixelsPerMetre(dpi: number): number {
  return Math.round(dpi / 0.0254);
}

const LENGTH_PATTERN = /^\s*(-?\d+(?:\.\d+)?|-?\.\d+)\s*(mm|in|cm|")?\s*$/i;

/** Parses "2in", "3 mm", "0.5\"", "1.2cm"; a bare number takes `defaultUnit`. */
export function parseLength(text: string, defaultUnit: LengthUnit = 'mm'): Mm | null {
  const match = LENGTH_PATTERN.exec(text);
  if (!match) return null;
  const value = Number(match[1]);
  const unit = (match[2] ?? defaultUnit).toLowerCase();
  if (unit === 'mm') return value;
  if (unit === 'cm') return value * 10;
  return inchToMm(value);
}

/** Formats a millimetre length in the user's unit, e.g. "2.25 in" or "57.2 mm". */
export function formatLength(value: Mm, unit: LengthUnit, digits = unit === 'in' ? 3 : 1): string {
  const n = fromMm(value, unit);
  const text = Number(n.toFixed(digits)).toString();
  return `${text} ${unit}`;
}

/**
 * A small length (gaps, features, bridges) in the user's unit where thousandths of an inch read
 * badly: under 0.1 in, two decimals with the millimetres beside ("0.04 in (1 mm)").
 */
export function formatFineLength(value: Mm, unit: LengthUnit): string {
  if (unit === 'mm' || value >= MM_PER_INCH / 10) return formatLength(value, unit);
  return `${formatLength(value, 'in', 2)} (${formatLength(value, 'mm', 2)})`;
}

/** CSS pixels for a length at a zoom where 1 = real size on a 96 DPI screen (CSS: 1in = 96px). */
export function mmToCssPx(length: Mm, zoom = 1): number {
  return (length / MM_PER_INCH) * CSS_PX_PER_INCH * zoom;
}
