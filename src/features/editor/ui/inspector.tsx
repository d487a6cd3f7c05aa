import { useEffect, useId, useState } from 'react';
import { commands } from '../../../../shared/sheet/commands';
import type { Piece } from '../../../../shared/sheet/document';
import type { LengthUnit } from '../../../../shared/units';
import { formatLength, fromMm, toMm } from '../../../../shared/units';
import { maxArtWidthMm, MAX_ROTATION_DEG } from '../../../../shared/sheet/bounds';
import type { ActionContext } from '../core/actions';
import { runAction } from '../core/run-action';

function LengthInput({
  label,
  mm,
  unit,
  onCommit,
  min,
  max,
  maxReason,
}: {
  label: string;
  mm: number;
  unit: LengthUnit;
  onCommit: (mm: number) => void;
  min: number;
  max?: number;
  maxReason?: string;
}) {
  const show = (v: number) => String(Number(fromMm(v, unit).toFixed(unit === 'in' ? 3 : 1)));
  const [text, setText] = useState(show(mm));
  const [error, setError] = useState<string | null>(null);
  const id = useId();
  useEffect(() => {
    setText(show(mm));
    setError(null);
  }, [mm, unit]); // eslint-disable-line react-hooks/exhaustive-deps
  const commit = () => {
    const value = toMm(Number(text.trim().replace(',', '.')), unit);
    if (text.trim() === '' || !Number.isFinite(value)) return setError(`Type a number of ${unit === 'in' ? 'inches' : 'millimetres'}.`);
    if (value < min - 1e-9) return setError(`At least ${formatLength(min, unit)}.`);
    // Refused here, with the reason, instead of being sent and refused by the server.
    if (max !== undefined && value > max + 1e-9) return setError(`At most ${formatLength(max, unit)}${maxReason ? `: ${maxReason}` : ''}.`);
    setError(null);
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
            onChange={(e) => setText(e.target.value)}
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
      {error && (
        <p id={`${id}-error`} role="alert" className="text-xs font-bold text-alarm">
          {error}
        </p>
      )}
    </div>
  );
}

/** Size, rotation, border and lock of the selection, plus align and distribute. */
export function Inspector({
  ctx,
  pieces,
  sizes,
}: {
  ctx: ActionContext;
  pieces: Piece[];
  sizes: Map<string, { widthMm: number; heightMm: number }>;
}) {
  const { store, unit, canEdit } = ctx;
  if (pieces.length === 0)
    return (
      <p className="text-sm text-ink-soft">
        {ctx.canEdit
          ? 'Select a piece to size it. Drag art from the left onto the sheet, or press Add under it.'
          : 'Select a piece to see its size.'}
      </p>
    );
  const ids = pieces.map((p) => p.id);
  const first = pieces[0];
  const frame = sizes.get(first.id);
  const doc = () => store.getState().doc;
  const button = (name: string, label: string) => (
    <button
      key={name}
      type="button"
      disabled={!canEdit}
      onClick={() => runAction(name, ctx)}
      className="rounded border-2 border-paper-edge px-2 py-1 text-xs font-bold hover:border-ink disabled:opacity-40"
    >
      {label}
    </button>
  );
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm font-bold">
        {pieces.length === 1 ? 'One piece' : `${pieces.length} pieces`}
        {first.locked && pieces.length === 1 ? ' (locked)' : ''}
      </p>
      <fieldset disabled={!canEdit} className="flex flex-col gap-2">
        <LengthInput
          label="Art width"
          mm={first.width}
          unit={unit}
          min={2}
          max={Math.min(...pieces.map((p) => maxArtWidthMm(doc(), p.border)))}
          maxReason="with its border the sticker must fit the print area"
          onCommit={(w) => store.dispatch(commands.resizePieces(doc(), ids, w))}
        />
        <LengthInput
          label="Border"
          mm={first.border}
          unit={unit}
          min={0}
          max={Math.max(0, Math.min(50, ...pieces.map((p) => (Math.max(doc().printArea.width, doc().printArea.height) - p.width) / 2)))}
          maxReason="with it the sticker must fit the print area"
          onCommit={(b) => store.dispatch(commands.setBorder(doc(), ids, b))}
        />
        <label className="flex items-center justify-between gap-2 text-sm font-bold">
          Rotation
          <input
            type="number"
            value={Math.round(first.rotation)}
            min={-MAX_ROTATION_DEG}
            max={MAX_ROTATION_DEG}
            onChange={(e) => {
              const r = Number(e.target.value);
              if (Number.isFinite(r) && Math.abs(r) <= MAX_ROTATION_DEG) store.dispatch(commands.setRotation(doc(), ids, r));
            }}
            onBlur={() => store.mark()}
            className="w-20 rounded border-2 border-paper-edge px-2 py-1 text-right font-normal"
            aria-label="Rotation (degrees)"
          />
        </label>
        <label className="flex items-center justify-between gap-2 text-sm font-bold">
          Cut
          <select
            value={first.cut ?? 'kiss'}
            onChange={(e) =>
              store.dispatch(commands.patchPieces(doc(), 'Cut', new Map(ids.map((id) => [id, { cut: e.target.value as 'kiss' | 'die' }]))))
            }
            className="rounded border-2 border-paper-edge bg-white px-2 py-1 font-normal"
            aria-label="Cut"
          >
            <option value="kiss">Kiss cut (face only)</option>
            <option value="die">Die cut (through the liner)</option>
          </select>
        </label>
        <label className="flex items-center justify-between gap-2 text-sm font-bold">
          Border colour
          <input
            type="color"
            value={first.borderColour}
            onChange={(e) => store.dispatch(commands.setBorderColour(doc(), ids, e.target.value))}
            onBlur={() => store.mark()}
            aria-label="Border colour"
          />
        </label>
      </fieldset>
      {frame && (
        <p className="text-xs text-ink-soft" data-testid="size-readout">
          Finished sticker {formatLength(frame.widthMm, unit)} × {formatLength(frame.heightMm, unit)}
        </p>
      )}
      <div className="flex flex-wrap gap-1">
        {button('rotate-cw', 'Rotate 90°')}
        {button('duplicate', 'Duplicate')}
        {button('lock', first.locked ? 'Unlock' : 'Lock')}
        {button('delete', 'Delete')}
      </div>
      {pieces.length > 1 && (
        <div className="flex flex-wrap gap-1" aria-label="Align and distribute">
          {button('align-left', 'Align left')}
          {button('align-centre', 'Centres')}
          {button('align-right', 'Right')}
          {button('align-top', 'Top')}
          {button('align-middle', 'Middles')}
          {button('align-bottom', 'Bottom')}
          {pieces.length > 2 && button('distribute-x', 'Space across')}
          {pieces.length > 2 && button('distribute-y', 'Space down')}
        </div>
      )}
    </div>
  );
}
