import type { Ring } from '../geometry/polygon';
import { perimeter } from '../geometry/polygon';

/** Total cut length of a sheet (mm): the sum of its cut-line perimeters. */
export function cutLength(rings: Ring[]): number {
  return rings.reduce((sum, ring) => sum + perimeter(ring), 0);
}

/** A pack's price spread over its sheets. */
export function costPerSheet(packPrice: number, sheetsPerPack: number): number {
  return packPrice / sheetsPerPack;
}

/**
 * Cartridge yields are rated on test pages of about 5 % coverage per colour (ISO/IEC 24711 with
 * the ISO/IEC 24712 page set; the 5 % figure is from memory), so a fully covered page costs the
 * cartridge price over a twentieth of its rated yield.
 */
const RATED_YIELD_COVERAGE = 0.05;
export function fullCoverageCost(cartridgePrice: number, ratedYieldPages: number): number {
  return cartridgePrice / (ratedYieldPages * RATED_YIELD_COVERAGE);
}

type CostInputs = {
  /** Price of one sheet of the stock. */
  stockPerSheet: number;
  /** Ink coverage of the print image: 1 = one full layer of ink over the whole print area. */
  coverage: number;
  /** The share of the paper the print area takes (print area ÷ paper area). */
  printAreaShare: number;
  /** What ink for one fully covered page costs on the chosen printer. */
  inkFullPage: number;
  cutLengthMm: number;
  /** The blade's price and the cut length (m) the maker replaces it at. */
  bladePrice: number;
  bladeLifeM: number;
  labourMinutes: number;
  labourRatePerHour: number;
  pieces: number;
  markupPercent: number;
  /** The shop's waste allowance: misprints and spoiled sheets, a share of the materials of every sheet. */
  wastePercent: number;
};

export type CostBreakdown = {
  stock: number;
  ink: number;
  blade: number;
  waste: number;
  labour: number;
  sheet: number;
  perSticker: number | null;
  suggestedSheet: number;
  suggestedSticker: number | null;
};

/**
 * Cost of one printed and cut sheet, per sticker, and a price at the maker's markup. The waste
 * allowance adds its share of the materials (stock, ink, blade), not of the labour.
 */
export function sheetCost(i: CostInputs): CostBreakdown {
  const stock = i.stockPerSheet;
  const ink = i.coverage * i.printAreaShare * i.inkFullPage;
  const blade = i.bladeLifeM > 0 ? (i.cutLengthMm / 1000 / i.bladeLifeM) * i.bladePrice : 0;
  const waste = ((stock + ink + blade) * i.wastePercent) / 100;
  const labour = (i.labourMinutes / 60) * i.labourRatePerHour;
  const sheet = stock + ink + blade + waste + labour;
  const factor = 1 + i.markupPercent / 100;
  const perSticker = i.pieces > 0 ? sheet / i.pieces : null;
  return {
    stock,
    ink,
    blade,
    waste,
    labour,
    sheet,
    perSticker,
    suggestedSheet: sheet * factor,
    suggestedSticker: perSticker === null ? null : perSticker * factor,
  };
}

export const formatMoney = (value: number, currency: string) => `${currency}${value.toFixed(2)}`;
