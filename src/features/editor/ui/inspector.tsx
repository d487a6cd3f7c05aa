import { commands } from '@shared/sheet/commands';
import type { Piece } from '@shared/sheet/document';
import { formatLength } from '@shared/units';
import { MAX_ROTATION_DEG } from '@shared/sheet/bounds';
import type { ActionContext } from '../core/actions';
import { actionNamed, enabled, runAction } from '../core/run-action';
import { LengthInput, PositionFields, SizeFields, common, useSizeBy } from './selection-fields';

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
  const [sizeBy, setSizeBy] = useSizeBy();
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
  const rotation = common(pieces.map((p) => p.rotation));
  const cuts = new Set(pieces.map((p) => p.cut ?? 'kiss'));
  const cut = cuts.size === 1 ? (first.cut ?? 'kiss') : null;
  const colour = new Set(pieces.map((p) => p.borderColour.toLowerCase())).size === 1 ? first.borderColour : null;
  const frame = sizes.get(first.id);
  const doc = () => store.getState().doc;
  const button = (name: string, label: string) => (
    <button
      key={name}
      type="button"
      disabled={!canEdit || !enabled(actionNamed(name), ctx)}
      title={actionNamed(name).label}
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
        <SizeFields ctx={ctx} pieces={pieces} sizeBy={sizeBy} setSizeBy={setSizeBy} />
        <LengthInput
          label="Border"
          mm={common(pieces.map((p) => p.border))}
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
            value={rotation === null ? '' : Math.round(rotation)}
            placeholder={rotation === null ? 'mixed' : undefined}
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
            value={cut ?? ''}
            onChange={(e) =>
              store.dispatch(commands.patchPieces(doc(), 'Cut', new Map(ids.map((id) => [id, { cut: e.target.value as 'kiss' | 'die' }]))))
            }
            className="rounded border-2 border-paper-edge bg-white px-2 py-1 font-normal"
            aria-label="Cut"
          >
            {cut === null && (
              <option value="" disabled>
                mixed
              </option>
            )}
            <option value="kiss">Kiss cut (face only)</option>
            <option value="die">Die cut (through the liner)</option>
          </select>
        </label>
        <label className="flex items-center justify-between gap-2 text-sm font-bold">
          <span>Border colour{colour === null && <span className="ml-1 text-xs font-normal text-ink-soft">(mixed)</span>}</span>
          <input
            type="color"
            value={colour ?? first.borderColour}
            onChange={(e) => store.dispatch(commands.setBorderColour(doc(), ids, e.target.value))}
            onBlur={() => store.mark()}
            aria-label="Border colour"
          />
        </label>
        <PositionFields ctx={ctx} pieces={pieces} />
      </fieldset>
      {frame && pieces.length === 1 && (
        <p className="text-xs text-ink-soft" data-testid="size-readout">
          Finished sticker {formatLength(frame.widthMm, unit)} × {formatLength(frame.heightMm, unit)}
        </p>
      )}
      <div className="flex flex-wrap gap-1">
        {button('rotate-cw', 'Rotate 90°')}
        {button('duplicate', 'Duplicate')}
        {button('lock', first.locked ? 'Unlock' : 'Lock')}
        {button('delete', 'Delete')}
        {pieces.length === 1 && button('label-grid', 'Fill with labels')}
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
