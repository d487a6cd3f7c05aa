// The three ways a blade tears a sticker, said with where they are: a waist narrower than the
// smallest feature (an inward offset by half of it splits the shape), a thin spike (an opening by a
// disk that wide removes it; with a border at least half the smallest feature the shape is a union
// of such disks and has none), and a slot too narrow to cut (the same opening of the outside).
import type { OutlineWarning } from '@shared/schemas/outline';
import { formatLength } from '@shared/units';
import { narrowPartsOf, necksOf, slotsOf } from './necks';
import type { RowRuns } from './runs';

export function tearWarnings(
  filled: RowRuns,
  o: { minFeaturePx: number; level: number; minFeatureMm: number; toMm: (px: number) => number; frame: { x: number; y: number } },
): OutlineWarning[] {
  const { minFeaturePx, level, toMm, frame } = o;
  const out: OutlineWarning[] = [];
  const where = (p: { x: number; y: number }) => ({ xMm: toMm(p.x - frame.x), yMm: toMm(p.y - frame.y) });
  const at = (p: { xMm: number; yMm: number }) => `(${formatLength(p.xMm, 'mm')}, ${formatLength(p.yMm, 'mm')})`;
  const waists = necksOf(filled, minFeaturePx);
  const slack = minFeaturePx;
  // A thin part that holds a waist is that waist: one warning for one place.
  const spikes =
    level >= minFeaturePx / 2
      ? []
      : narrowPartsOf(filled, minFeaturePx).filter(
          (t) =>
            !waists.some(
              (w) =>
                w.x >= t.box.minX - slack && w.x <= t.box.maxX + 1 + slack && w.y >= t.box.minY - slack && w.y <= t.box.maxY + 1 + slack,
            ),
        );
  const necks = [...waists, ...spikes];
  for (const neck of necks) {
    const p = where(neck);
    out.push({
      code: 'narrow-neck',
      severity: 'warning',
      at: p,
      message: `The cut line narrows below ${formatLength(o.minFeatureMm, 'mm')} near ${at(p)} from the sticker's top-left corner: the blade may tear it. Widen the border, or let Sheetsmith widen narrow necks.`,
    });
  }
  for (const slot of slotsOf(filled, minFeaturePx)) {
    const p = where(slot);
    out.push({
      code: 'narrow-slot',
      severity: 'warning',
      at: p,
      message: `The cut line has a slot narrower than ${formatLength(o.minFeatureMm, 'mm')} near ${at(p)} from the sticker's top-left corner: the blade cannot cut it cleanly. Widen the border to close it.`,
    });
  }
  return out;
}
