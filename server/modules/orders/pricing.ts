// A line's price from the cost model at the shop's markup: copies of a sheet cost what the print
// room's costing says a sheet costs; singles cost the stock's price per sheet (with the waste
// allowance) spread over as many stickers as a grid of them fits in the team's print area.
import { finishedHeight, gridCount } from '@shared/orders/pricing';
import { sheetCost, costPerSheet } from '@shared/production/cost';
import type { ShopSettings } from '@shared/schemas/shop';
import { inchToMm, formatLength } from '@shared/units';
import { AppError } from '../../lib/errors';
import type { SheetProfile } from '../sheets/sheet-profile.entity';
import type { StockItem } from '../shop/stock-item.entity';

/** The border singles get (1/8 in, as the default profile's gap: common practice). */
export const SINGLES_BORDER_MM = inchToMm(0.125);

const refused = (field: string, message: string) => new AppError(400, 'validation_failed', message, { [field]: message });

type SinglesSize = { widthMm: number; heightMm: number; perSheet: number };

/** The finished size and how many fit a sheet; refused when not even one fits the print area. */
export function singlesSize(
  art: { name: string; widthPx: number; heightPx: number },
  finishedWidthMm: number,
  profile: SheetProfile,
  unit: 'in' | 'mm',
): SinglesSize {
  const heightMm = finishedHeight(finishedWidthMm, SINGLES_BORDER_MM, art.heightPx / art.widthPx);
  const perSheet = gridCount({ width: profile.areaWidthMm, height: profile.areaHeightMm }, profile.safeMarginMm, profile.minGapMm, {
    width: finishedWidthMm,
    height: heightMm,
  });
  if (perSheet === 0)
    throw refused(
      'finishedWidthMm',
      `${art.name} at ${formatLength(finishedWidthMm, unit)} wide is ${formatLength(heightMm, unit)} tall with its border: larger than the print area of "${profile.name}" (${formatLength(profile.areaWidthMm, unit)} × ${formatLength(profile.areaHeightMm, unit)} less the margin). Pick a smaller size.`,
    );
  return { widthMm: finishedWidthMm, heightMm, perSheet };
}

/** Cents per sticker from the stock's price per sheet; refused without a stock to price from. */
export function singlesPriceMinor(stock: StockItem | null, perSheet: number, settings: ShopSettings): number {
  if (!stock)
    throw refused('stockId', 'Pick a stock for this line (or set the shop’s usual stock in shop rates) to price it, or type a price.');
  const cost = sheetCost({
    stockPerSheet: costPerSheet(stock.packPrice, stock.sheetsPerPack),
    coverage: 0,
    printAreaShare: 0,
    inkFullPage: 0,
    cutLengthMm: 0,
    bladePrice: 0,
    bladeLifeM: 0,
    labourMinutes: 0,
    labourRatePerHour: 0,
    pieces: perSheet,
    markupPercent: settings.markupPercent,
    wastePercent: settings.wastePercent,
  });
  return Math.max(1, Math.round((cost.suggestedSticker ?? 0) * 100));
}

/** Cents per copy of a sheet from the print room's costing; refused when the sheet is not priced. */
export function sheetPriceMinor(view: { priced: boolean; cost: { suggestedSheet: number } }, sheetName: string): number {
  if (!view.priced)
    throw refused('unitPrice', `"${sheetName}" has no stock to price it from: pick its stock in the print room, or type a price.`);
  return Math.max(1, Math.round(view.cost.suggestedSheet * 100));
}
