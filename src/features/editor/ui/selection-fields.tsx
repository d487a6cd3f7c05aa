// The selection's numbers in the user's unit: size by the finished sticker or by the art (the
// other figure beside it), and position by the sticker's left and top edges from the print area's
// corner. Pieces that differ show "mixed"; a value typed there applies to each of them.
import { useEffect, useId, useState } from 'react';
import { commands } from '@shared/sheet/commands';
import type { Piece } from '@shared/sheet/document';
import type { LengthUnit } from '@shared/units';
import { formatLength, fromMm, toMm } from '@shared/units';
import { maxArtWidthMm } from '@shared/sheet/bounds';
import type { ActionContext } from '../core/actions';

/** One figure for all the pieces, or null when they differ (beyond a hundredth of a millimetre). */
export function common(values: number[]): number | null {
  return values.every((v) => Math.abs(v - values[0]) < 0.01) ? values[0] : null;
}

export function LengthInput({
  label,
  mm,
  unit,
  onCommit,
  min,
  max,
  maxReason,
  aside,
}: {
  label: string;
  /** The selection's figure, or null when the pieces differ ("mixed"). */
  mm: number | null;
  unit: LengthUnit;
  /** The other figure, shown beside the field (e.g. the art's width beside the sticker's). */
  aside?: string;
  onCommit: (mm: number) => void;
  min: number;
  max?: number;
  maxReason?: string;
}) {
  const show = (v: number | null) => (v === null ? '' : String(Number(fromMm(v, unit).toFixed(unit === 'in' ? 3 : 1))));
  const [text, setText] = useState(show(mm));
  // Only typed text is committed: leaving the field after Enter, or after the selection changed
  // under it, must not apply the old figure to the newly selected pieces.
  const [typed, setTyped] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const id = useId();
  useEffect(() => {
    setText(show(mm));
    setTyped(false);
    setError(null);
  }, [mm, unit]); // eslint-disable-line react-hooks/exhaustive-deps
  const commit = () => {
    if (!typed) return;
    if (mm === null && text.trim() === '') return setError(null); // left mixed: nothing changes
    const value = toMm(Number(text.trim().replace(',', '.')), unit);
    if (text.trim() === '' || !Number.isFinite(value)) return setError(`Type a number of ${unit === 'in' ? 'inches' : 'millimetres'}.`);
    if (value < min - 1e-9) return setError(`At least ${formatLength(min, unit)}.`);
    // Refused here, with the reason, instead of being sent and refused by the server.
    if (max !== undefined && value > max + 1e-9) return setError(`At most ${formatLength(max, unit)}${maxReason ? `: ${maxReason}` : ''}.`);
    setError(null);
    setTyped(false);
    onCommit(value);
  };
  return (
    <div className="flex flex-col gap-1">
      <label className="flex items-center justify-between gap-2 text-sm font-bold">
        {label}
        <span className="flex items-center gap-1">
          <input
            value={text}
            inputMode="decimal"
            placeholder={mm === null ? 'mixed' : undefined}
            onChange={(e) => {
              setText(e.target.value);
              setTyped(true);
            }}
            onBlur={commit}
            onKeyDown={(e) => e.key === 'Enter' && commit()}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${id}-error` : undefined}
            className={`w-20 rounded border-2 px-2 py-1 text-right font-normal ${error ? 'border-alarm' : 'border-paper-edge'}`}
            aria-label={`${label} (${unit})`}
          />
          <span className="w-6 font-normal">{unit}</span>
        </span>
      </label>
      {aside && <p className="-mt-1 text-right text-xs text-ink-soft">{aside}</p>}
      {error && (
        <p id={`${id}-error`} role="alert" className="text-xs font-bold text-alarm">
          {error}
        </p>
      )}
    </div>
  );
}

type SizeBy = 'sticker' | 'art';
const SIZE_BY_KEY = 'sheetsmith.sizeBy';
/** Sized by the finished sticker unless the maker chose the art (remembered in this browser). */
export function useSizeBy(): [SizeBy, (s: SizeBy) => void] {
  const [sizeBy, set] = useState<SizeBy>(() => (globalThis.localStorage?.getItem(SIZE_BY_KEY) === 'art' ? 'art' : 'sticker'));
  return [
    sizeBy,
    (s) => {
      globalThis.localStorage?.setItem(SIZE_BY_KEY, s);
      set(s);
    },
  ];
}

/** Width by the finished sticker (art + a border each side, as the cut line's frame) or by the art. */
export function SizeFields({
  ctx,
  pieces,
  sizeBy,
  setSizeBy,
}: {
  ctx: ActionContext;
  pieces: Piece[];
  sizeBy: SizeBy;
  setSizeBy: (s: SizeBy) => void;
}) {
  const { store, unit } = ctx;
  const doc = () => store.getState().doc;
  const art = common(pieces.map((p) => p.width));
  const sticker = common(pieces.map((p) => p.width + 2 * p.border));
  const maxArt = Math.min(...pieces.map((p) => maxArtWidthMm(doc(), p.border)));
  const f = (mm: number | null) => (mm === null ? 'mixed' : formatLength(mm, unit));
  return (
    <>
      <div role="radiogroup" aria-label="Size by" className="flex items-center justify-between gap-2 text-sm font-bold">
        Size by
        <span className="flex overflow-hidden rounded border-2 border-paper-edge text-xs">
          {(['sticker', 'art'] as const).map((s) => (
            <button
              key={s}
              type="button"
              role="radio"
              aria-checked={sizeBy === s}
              onClick={() => setSizeBy(s)}
              className={`px-2 py-1 ${sizeBy === s ? 'bg-ink text-paper' : 'bg-white'}`}
            >
              {s === 'sticker' ? 'Sticker' : 'Art'}
            </button>
          ))}
        </span>
      </div>
      {sizeBy === 'sticker' ? (
        <LengthInput
          label="Sticker width"
          mm={sticker}
          unit={unit}
          aside={`art ${f(art)}`}
          min={Math.max(...pieces.map((p) => 2 + 2 * p.border))}
          max={Math.min(...pieces.map((p) => maxArt + 2 * p.border))}
          maxReason="the sticker must fit the print area"
          onCommit={(w) =>
            store.dispatch(commands.patchPieces(doc(), 'Resize', new Map(pieces.map((p) => [p.id, { width: w - 2 * p.border }]))))
          }
        />
      ) : (
        <LengthInput
          label="Art width"
          mm={art}
          unit={unit}
          aside={`sticker ${f(sticker)}`}
          min={2}
          max={maxArt}
          maxReason="with its border the sticker must fit the print area"
          onCommit={(w) =>
            store.dispatch(
              commands.resizePieces(
                doc(),
                pieces.map((p) => p.id),
                w,
              ),
            )
          }
        />
      )}
    </>
  );
}

/** X and Y of the sticker's left and top edges from the print area's corner; kept within the print area. */
export function PositionFields({ ctx, pieces }: { ctx: ActionContext; pieces: Piece[] }) {
  const { store, unit } = ctx;
  const doc = () => store.getState().doc;
  const area = doc().printArea;
  const halves = pieces.map((p) => ({ p, h: ctx.halfSize(p) }));
  const place = (axis: 'x' | 'y', edge: number) =>
    store.dispatch(
      commands.placePieces(
        doc(),
        new Map(halves.map(({ p, h }) => [p.id, axis === 'x' ? { x: edge + h.w, y: p.y } : { x: p.x, y: edge + h.h }])),
      ),
    );
  return (
    <div className="flex flex-col gap-2" aria-label="Position">
      <LengthInput
        label="X"
        mm={common(halves.map(({ p, h }) => p.x - h.w))}
        unit={unit}
        min={0}
        max={Math.max(0, Math.min(...halves.map(({ h }) => area.width - 2 * h.w)))}
        maxReason="the sticker must stay on the print area"
        onCommit={(x) => place('x', x)}
      />
      <LengthInput
        label="Y"
        mm={common(halves.map(({ p, h }) => p.y - h.h))}
        unit={unit}
        min={0}
        max={Math.max(0, Math.min(...halves.map(({ h }) => area.height - 2 * h.h)))}
        maxReason="the sticker must stay on the print area"
        onCommit={(y) => place('y', y)}
      />
    </div>
  );
}
