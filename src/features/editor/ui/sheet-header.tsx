import { SHEET_STATUS_LABELS, SHEET_STATUSES } from '@shared/schemas/sheets';
import type { EditorState, EditorStore } from '../core/editor-store';

const SAVE_TEXT = {
  saved: 'All changes saved',
  unsaved: 'Unsaved changes…',
  saving: 'Saving…',
  offline: 'Offline: will retry',
  conflict: 'Not saved: conflict',
  refused: 'Not saved: see why',
} as const;

/** The sheet's name, status, sale flag and unit, how saving goes, and why a save was refused. */
export function SheetHeader({ store, state, canEdit }: { store: EditorStore; state: EditorState; canEdit: boolean }) {
  const unit = state.meta.unit;
  return (
    <>
      <div className="flex flex-wrap items-center gap-3">
        <input
          aria-label="Sheet name"
          value={state.meta.name}
          disabled={!canEdit}
          onChange={(e) => store.setMeta({ name: e.target.value })}
          className="min-w-0 flex-1 rounded-lg border-2 border-transparent bg-transparent px-2 text-2xl font-extrabold hover:border-paper-edge focus:border-peel"
        />
        <select
          aria-label="Status"
          value={state.meta.status}
          disabled={!canEdit}
          onChange={(e) => store.setMeta({ status: e.target.value as typeof state.meta.status })}
          className="rounded-lg border-2 border-paper-edge bg-white px-2 py-1 text-sm"
        >
          {SHEET_STATUSES.map((s) => (
            <option key={s} value={s}>
              {SHEET_STATUS_LABELS[s]}
            </option>
          ))}
        </select>
        <label className="flex items-center gap-1 text-sm font-bold">
          <input
            type="checkbox"
            checked={state.meta.forSale}
            disabled={!canEdit}
            onChange={(e) => store.setMeta({ forSale: e.target.checked })}
          />
          For sale
        </label>
        <select
          aria-label="Unit"
          value={unit}
          onChange={(e) => store.setMeta({ unit: e.target.value as 'in' | 'mm' })}
          disabled={!canEdit}
          className="rounded-lg border-2 border-paper-edge bg-white px-2 py-1 text-sm"
        >
          <option value="in">in</option>
          <option value="mm">mm</option>
        </select>
        <span
          role="status"
          data-testid="save-state"
          className={`rounded-full px-3 py-1 text-xs font-bold ${state.save === 'saved' ? 'bg-sage-light text-sage-deep' : state.save === 'conflict' || state.save === 'offline' || state.save === 'refused' ? 'bg-alarm-light text-alarm' : 'bg-paper-deep'}`}
        >
          {canEdit ? SAVE_TEXT[state.save] : 'Read only: your role can view sheets'}
        </span>
      </div>
      {state.refusal && (
        <div
          role="alert"
          data-testid="save-refusal"
          className="flex items-start gap-3 rounded-lg border-2 border-alarm bg-alarm-light px-3 py-2 text-sm text-alarm"
        >
          <p className="flex-1">
            <strong>Not saved as it was.</strong> {state.refusal.message}{' '}
            {state.refusal.fitted
              ? 'Sheetsmith fitted it back within reach (it is selected now) so the rest of your work keeps saving; Undo shows what you had.'
              : 'Change it and the sheet saves again.'}
          </p>
          <button type="button" className="font-bold underline" onClick={() => store.dismissRefusal()}>
            Dismiss
          </button>
        </div>
      )}
    </>
  );
}
