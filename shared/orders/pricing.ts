// How many die-cut singles of one size a sheet holds, for pricing a quote before any sheet exists:
// a plain grid of the sticker's frame with the gap between, upright or turned a quarter (whichever
// holds more). The nester packs true shapes tighter when the sheets are made; a quote from the grid
// is on the safe side.

type Size = { width: number; height: number };

export function gridCount(area: Size, margin: number, gap: number, sticker: Size): number {
  const fit = (w: number, h: number) => {
    const cols = Math.floor((area.width - 2 * margin + gap) / (w + gap) + 1e-9);
    const rows = Math.floor((area.height - 2 * margin + gap) / (h + gap) + 1e-9);
    return Math.max(0, cols) * Math.max(0, rows);
  };
  return Math.max(fit(sticker.width, sticker.height), fit(sticker.height, sticker.width));
}

/** The finished height of a sticker whose art is `aspect` (height ÷ width) at a finished width, border included. */
export const finishedHeight = (finishedWidth: number, border: number, aspect: number) => (finishedWidth - 2 * border) * aspect + 2 * border;
