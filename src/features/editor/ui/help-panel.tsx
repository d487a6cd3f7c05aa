import { ACTIONS } from '../core/actions';

/** Every keyboard shortcut, read from the same action registry the keyboard uses. */
export function HelpPanel({ onClose }: { onClose: () => void }) {
  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="help-title"
      className="fixed inset-0 z-50 flex items-center justify-center bg-ink/40 p-4"
      onClick={onClose}
    >
      <div className="max-h-[80vh] w-full max-w-lg overflow-auto rounded-sticker bg-white p-6" onClick={(e) => e.stopPropagation()}>
        <h2 id="help-title" className="mb-3 text-xl font-extrabold">
          Keyboard shortcuts
        </h2>
        <table className="w-full text-sm">
          <tbody>
            {ACTIONS.filter((a) => a.shortcut).map((a) => (
              <tr key={a.name} className="border-t border-paper-deep">
                <td className="py-1">{a.label}</td>
                <td className="py-1 text-right">
                  <kbd className="rounded border border-paper-edge bg-paper px-2 font-mono text-xs">{a.shortcut}</kbd>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="mt-3 text-xs text-ink-soft">
          Drag on empty sheet to select several; Shift-click adds to the selection. Ctrl/⌘ + wheel zooms, the wheel pans.
        </p>
        <button type="button" autoFocus onClick={onClose} className="mt-4 rounded-full bg-ink px-4 py-1 font-bold text-paper">
          Close
        </button>
      </div>
    </div>
  );
}
