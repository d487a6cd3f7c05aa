import type { ArrangeChoice } from '../core/arrange-plan';
import { MAX_QUANTITY } from '../core/arrange-plan';

export type ArrangeWhere = 'here' | 'server';
/** One art's row in "How many of each": what was typed, read as a number or a message. */
type QuantityRow = { key: string; name: string; count: number; q: { value: number } | { error: string } };

type Props = {
  choice: ArrangeChoice;
  setChoice: (choice: ArrangeChoice) => void;
  where: ArrangeWhere;
  setWhere: (where: ArrangeWhere) => void;
  rows: QuantityRow[];
  typed: Record<string, string>;
  setTyped: (typed: Record<string, string>) => void;
  /** Once a preview is shown, the choices that made it stay as they were. */
  disabled: boolean;
};

/** What to arrange and how: the pieces, turning, filling or how many of each, where, and for how long. */
export function ArrangeOptions({ choice, setChoice, where, setWhere, rows, typed, setTyped, disabled }: Props) {
  return (
    <fieldset className="mb-2 flex flex-col gap-2" disabled={disabled}>
      <label className="flex items-center justify-between font-bold">
        Pieces
        <select
          value={choice.scope}
          onChange={(e) => setChoice({ ...choice, scope: e.target.value as ArrangeChoice['scope'] })}
          className="rounded border-2 border-paper-edge px-1"
        >
          <option value="sheet">Whole sheet</option>
          <option value="selection">Selection only</option>
        </select>
      </label>
      <label className="flex items-center justify-between font-bold">
        Turning
        <select
          value={typeof choice.rotate === 'object' ? ('step' in choice.rotate ? `step${choice.rotate.step}` : '90') : choice.rotate}
          onChange={(e) =>
            setChoice({
              ...choice,
              rotate: e.target.value === 'none' ? 'none' : e.target.value === '90' ? '90' : { step: Number(e.target.value.slice(4)) },
            })
          }
          className="rounded border-2 border-paper-edge px-1"
        >
          <option value="none">Keep upright</option>
          <option value="90">Quarter turns</option>
          <option value="step15">Any angle, 15° steps</option>
        </select>
      </label>
      <label className="flex items-center gap-2 font-bold">
        <input type="checkbox" checked={choice.fill} onChange={(e) => setChoice({ ...choice, fill: e.target.checked })} />
        Fill the sheet with more copies
      </label>
      {!choice.fill && rows.length > 0 && (
        <div className="flex max-h-40 flex-col gap-1 overflow-y-auto" data-testid="arrange-quantities">
          <span className="font-bold">How many of each</span>
          {rows.map((g) => (
            <label key={g.key} className="flex items-center justify-between gap-2">
              <span className="truncate" title={g.name}>
                {g.name}
              </span>
              <input
                type="number"
                inputMode="numeric"
                min={1}
                max={MAX_QUANTITY}
                aria-label={`Quantity of ${g.name}`}
                aria-invalid={'error' in g.q}
                value={typed[g.key] ?? String(g.count)}
                onChange={(e) => setTyped({ ...typed, [g.key]: e.target.value })}
                className={`w-20 rounded border-2 px-1 text-right ${'error' in g.q ? 'border-alarm' : 'border-paper-edge'}`}
              />
            </label>
          ))}
        </div>
      )}
      <label className="flex items-center justify-between font-bold">
        Run on
        <select
          value={where}
          onChange={(e) => setWhere(e.target.value as 'here' | 'server')}
          className="rounded border-2 border-paper-edge px-1"
        >
          <option value="here">This computer</option>
          <option value="server">The shop’s server</option>
        </select>
      </label>
      <label className="flex items-center justify-between font-bold">
        Try for
        <select
          value={choice.seconds}
          onChange={(e) => setChoice({ ...choice, seconds: Number(e.target.value) })}
          className="rounded border-2 border-paper-edge px-1"
        >
          {(where === 'server' ? [2, 10, 30, 60, 120] : [1, 2, 5, 10]).map((s) => (
            <option key={s} value={s}>
              {s < 60 ? `${s} s` : `${s / 60} min`}
            </option>
          ))}
        </select>
      </label>
    </fieldset>
  );
}
