import { useEffect, useRef } from 'react';
import type { ActionContext } from '../core/actions';
import { actionNamed, enabled, runAction } from '../core/run-action';

/** What the sheet's context menu offers, in order; labels, shortcuts and availability come from the action registry. */
const CONTEXT_ACTIONS = ['duplicate', 'rotate-cw', 'rotate-ccw', 'lock', 'delete', 'label-grid', 'select-all', 'arrange'];

/**
 * The canvas's context menu (right click, the Menu key or Shift+F10): the registry's actions for the
 * selection, each with its shortcut; arrows move between them, Enter runs one, Escape closes.
 */
export function ContextMenu({ ctx, at, onClose }: { ctx: ActionContext; at: { x: number; y: number }; onClose: () => void }) {
  const menu = useRef<HTMLDivElement>(null);
  const items = CONTEXT_ACTIONS.map(actionNamed);
  useEffect(() => {
    menu.current?.querySelector<HTMLButtonElement>('button:not(:disabled)')?.focus();
    const away = (e: MouseEvent) => !menu.current?.contains(e.target as Node) && onClose();
    window.addEventListener('mousedown', away);
    return () => window.removeEventListener('mousedown', away);
  }, [onClose]);
  const move = (e: React.KeyboardEvent) => {
    const buttons = [...(menu.current?.querySelectorAll<HTMLButtonElement>('button:not(:disabled)') ?? [])];
    const i = buttons.indexOf(document.activeElement as HTMLButtonElement);
    if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      buttons[(i + (e.key === 'ArrowDown' ? 1 : buttons.length - 1)) % buttons.length]?.focus();
    } else if (e.key === 'Escape' || e.key === 'Tab') {
      e.preventDefault();
      onClose();
    }
  };
  return (
    <div
      ref={menu}
      role="menu"
      aria-label="Selection actions"
      onKeyDown={move}
      style={{ left: at.x, top: at.y }}
      className="absolute z-40 flex min-w-56 flex-col rounded-lg border-2 border-paper-edge bg-white py-1 text-sm shadow-lg"
      data-testid="context-menu"
    >
      {items.map((a) => (
        <button
          key={a.name}
          type="button"
          role="menuitem"
          disabled={!enabled(a, ctx)}
          onClick={() => {
            runAction(a.name, ctx);
            onClose();
          }}
          className="flex justify-between gap-4 px-3 py-1 text-left hover:bg-paper focus:bg-paper focus:outline-none disabled:text-ink-faint"
        >
          <span>{a.short ?? a.label}</span>
          {a.shortcut && <span className="text-xs text-ink-soft">{a.shortcut}</span>}
        </button>
      ))}
    </div>
  );
}
