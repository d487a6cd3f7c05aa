import type { ReactNode } from 'react';
import type { ActionContext } from '../core/actions';
import { actionNamed, enabled, runAction } from '../core/run-action';

const LOOKS: Record<string, string> = {
  arrange: 'ml-2 rounded-full bg-peel px-3 py-1 font-bold text-ink disabled:opacity-60',
  export: 'rounded-full bg-sage-deep px-3 py-1 font-bold text-white disabled:opacity-60',
};
const PLAIN = 'rounded border-2 border-paper-edge bg-white px-2 py-1 font-bold disabled:opacity-40';

/**
 * The editor's toolbar, drawn from the action registry: each entry's label (or its short form),
 * shortcut and whether it can run now come from the same action the keyboard and the help use.
 * Actions that need the right to edit are not shown to those without it; `open` marks panels
 * already open. `between` goes after the named action.
 */
export function Toolbar({
  ctx,
  names,
  open = [],
  after,
}: {
  ctx: ActionContext;
  names: string[];
  open?: string[];
  after?: { name: string; node: ReactNode };
}) {
  return (
    <div className="flex flex-wrap items-center gap-1 text-sm" role="toolbar" aria-label="Sheet tools">
      {names.map((name) => {
        const action = actionNamed(name);
        if (action.edits && !ctx.canEdit) return after?.name === name ? <span key={name}>{after.node}</span> : null;
        const title = action.shortcut ? `${action.label} (${action.shortcut})` : action.label;
        const control = action.checked ? (
          <label key={name} className="ml-2 flex items-center gap-1 font-bold" title={title}>
            <input type="checkbox" checked={action.checked(ctx)} onChange={() => runAction(name, ctx)} />
            {action.short ?? action.label}
          </label>
        ) : (
          <button
            key={name}
            type="button"
            className={LOOKS[name] ?? PLAIN}
            disabled={!enabled(action, ctx) || open.includes(name)}
            onClick={() => runAction(name, ctx)}
            title={title}
            aria-label={action.short && action.short.length < 3 ? action.label : undefined}
          >
            {action.short ?? action.label}
          </button>
        );
        return after?.name === name ? (
          <span key={name} className="contents">
            {control}
            {after.node}
          </span>
        ) : (
          control
        );
      })}
    </div>
  );
}
