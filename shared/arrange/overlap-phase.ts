// The overlap search after the constructive start, for the nester: the shapes grown by half the gap
// in every allowed turn, the strip shortened (strip.ts) or the sheets filled and emptied
// (sheet-search.ts), and nothing handed back that the exact check on the cut lines refuses.
import type { ArrangeItem, LockedPiece, Placement, RotateMode } from './nester';
import { rotationsOf } from './input';
import type { Placed } from './improve';
import { exactlyValid, layoutOf, placementsOf } from './improve';
import { emptyLastSheet, fillSheet } from './sheet-search';
import type { Variant } from './shapes';
import { variantsOf } from './shapes';
import type { StripOptions } from './strip';
import { shortenStrip } from './strip';

type PhaseInput = {
  items: ArrangeItem[];
  locked: LockedPiece[];
  rotate: RotateMode;
  gap: number;
  margin: number;
  width: number;
  height: number;
};
type Budget = { deadline: number; random: () => number; maxTries?: number; shouldStop?: () => boolean };

function prepare(input: PhaseInput) {
  const variants = new Map<string, Variant[]>(
    input.items.map((item) => [item.key, variantsOf(item.outline, rotationsOf(item.rotate ?? input.rotate), input.gap / 2)]),
  );
  for (const l of input.locked) if (!variants.has(l.key)) variants.set(l.key, variantsOf(l.outline, [l.rotation], input.gap / 2));
  return {
    variantsOf: (key: string) => variants.get(key)!,
    area: { x0: input.margin, y0: input.margin, x1: input.width - input.margin, y1: input.height - input.margin },
    fixed: input.locked.map((l) => ({ key: l.key, x: l.x, y: l.y, rotation: l.rotation })),
  };
}

/** A shorter strip from a layout without overlap, or null when the exact check refuses the result. */
export function stripPhase(
  placements: Placement[],
  input: PhaseInput,
  budget: StripOptions,
): { placements: Placement[]; length: number; tries: number } | null {
  const { variantsOf, area, fixed } = prepare(input);
  const { layout, keys } = layoutOf(placements, variantsOf, area, fixed);
  const { length, tries } = shortenStrip(layout, budget);
  if (!exactlyValid(layout, input.gap)) return null;
  return { placements: placementsOf(layout, keys).map((p) => ({ ...p, sheet: 0 })), length, tries };
}

/** Fill: more copies on the sheet; quantities: the last sheet emptied into the others. Null when nothing changed. */
export function sheetPhase(
  placements: Placement[],
  sheetCount: number,
  fill: boolean,
  input: PhaseInput,
  budget: Budget,
): Placement[] | null {
  const { variantsOf, area, fixed } = prepare(input);
  const search = { variantsOf, area, gap: input.gap, ...budget };
  if (fill) {
    const filled = fillSheet(
      placements,
      fixed,
      input.items.map((i) => i.key),
      search,
    );
    return filled && filled.map((p) => ({ ...p, sheet: 0 }));
  }
  let sheets: Placed[][] = Array.from({ length: sheetCount }, (_, s) => placements.filter((p) => p.sheet === s));
  let changed = false;
  // The separator starts from random spots, so a last sheet that would not empty may on another
  // try: up to three tries in a row while time is left.
  for (let failed = 0; sheets.length > 1 && failed < 3 && Date.now() < budget.deadline && !budget.shouldStop?.();) {
    const fewer = emptyLastSheet(sheets, fixed, search);
    if (!fewer) {
      failed++;
      continue;
    }
    failed = 0;
    sheets = fewer;
    changed = true;
  }
  return changed ? sheets.flatMap((placed, s) => placed.map((p) => ({ ...p, sheet: s }))) : null;
}
