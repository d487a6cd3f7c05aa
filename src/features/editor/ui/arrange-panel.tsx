import { useMemo, useRef, useState } from 'react';
import { Link } from 'react-router';
import type { ArrangeProgress, ArrangeResult } from '@shared/arrange/nester';
import { applyDiff } from '@shared/sheet/commands';
import type { Command } from '@shared/sheet/commands';
import type { PieceOutline } from '../api/outlines';
import type { SheetDocument } from '@shared/sheet/document';
import type { ArrangeChoice } from '../core/arrange-plan';
import { arrangeCommand, arrangeGroups, defaultTurning, furtherSheets, parseQuantity, planArrange } from '../core/arrange-plan';
import type { EditorStore } from '../core/editor-store';
import { ArrangeRunner } from '../core/arrange-runner';
import { ServerArrangeRunner } from '../api/arrange-runs';
import { threadsFor } from '@shared/arrange/portfolio';
import { ArrangeOptions } from './arrange-options';
import type { ArrangeWhere } from './arrange-options';

type Props = {
  store: EditorStore;
  outlines: Map<string, { outline: PieceOutline | undefined }>;
  nameOf: (artId: string) => string;
  onPreview: (doc: SheetDocument | null) => void;
  /** Saves the further sheets a quantity needs; answers their ids and names. */
  onFurtherSheets: (docs: SheetDocument[]) => Promise<Array<{ id: string; name: string }>>;
  sheetLink: (id: string) => string;
  /** The sheet's arrange runs on the server (API path). */
  serverRuns: string;
  onClose: () => void;
};

type Runner = ArrangeRunner | ServerArrangeRunner;

/**
 * Arrange options (which pieces, how many of each, turning, time), a run in a Web Worker with
 * progress, then a preview on the canvas that the user keeps (one undo step, plus any further sheets
 * a quantity needs, made as new sheets) or throws away.
 */
export function ArrangePanel({ store, outlines, nameOf, onPreview, onFurtherSheets, sheetLink, serverRuns, onClose }: Props) {
  const [where, setWhere] = useState<ArrangeWhere>('here');
  const [choice, setChoice] = useState<ArrangeChoice>(() => {
    const s = store.getState();
    const scope = s.selection.size > 1 ? 'selection' : 'sheet';
    return {
      scope,
      rotate: defaultTurning([...arrangeGroups(s.doc, s.selection, scope).values()].flat()),
      fill: false,
      seconds: 2,
      seed: 1,
    };
  });
  const groups = useMemo(() => {
    const s = store.getState();
    return [...arrangeGroups(s.doc, s.selection, choice.scope)].map(([key, pieces]) => ({
      key,
      name: nameOf(pieces[0].artId),
      count: pieces.length,
      die: pieces.every((p) => p.cut === 'die'),
    }));
    // Read when the panel opens or the scope changes, not after a kept layout has changed the sheet.
  }, [store, choice.scope]); // eslint-disable-line react-hooks/exhaustive-deps
  const [typed, setTyped] = useState<Record<string, string>>({});
  const parsed = groups.map((g) => ({ ...g, q: parseQuantity(typed[g.key] ?? String(g.count), g.name) }));
  const quantityErrors = choice.fill ? [] : parsed.flatMap((g) => ('error' in g.q ? [g.q.error] : []));
  const [made, setMade] = useState<Array<{ id: string; name: string }> | null>(null);
  const [making, setMaking] = useState(false);
  const [kept, setKept] = useState(false);
  const [progress, setProgress] = useState<(ArrangeProgress & { threads: number }) | null>(null);
  const [stopping, setStopping] = useState(false);
  const [result, setResult] = useState<{ command: Command; summary: ArrangeResult; further: SheetDocument[] } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const runner = useRef<Runner | null>(null);
  const best = useRef<{ groups: ReturnType<typeof planArrange>['groups']; doc: SheetDocument } | null>(null);
  const running = progress !== null && !result && !error;

  const state0 = store.getState();
  const waiting = state0.doc.pieces.filter(
    (p) => !p.locked && (choice.scope === 'sheet' || state0.selection.has(p.id)) && !outlines.get(p.id)?.outline,
  ).length;

  const start = () => {
    setError(null);
    setStopping(false);
    setResult(null);
    const state = store.getState();
    if (quantityErrors.length) return;
    const quantities = choice.fill ? undefined : Object.fromEntries(parsed.flatMap((g) => ('value' in g.q ? [[g.key, g.q.value]] : [])));
    const plan = planArrange(state.doc, state.selection, outlines, { ...choice, quantities }, nameOf);
    if (plan.items.length === 0) {
      setError('Nothing to arrange: choose pieces that are not locked, and wait for their outlines.');
      return;
    }
    runner.current?.close();
    const threads = where === 'server' ? 0 : threadsFor(navigator.hardwareConcurrency || 2);
    const r =
      where === 'server'
        ? new ServerArrangeRunner(serverRuns)
        : new ArrangeRunner(() => new Worker(new URL('../core/arrange.worker.ts', import.meta.url), { type: 'module' }), threads);
    runner.current = r;
    best.current = null;
    setProgress({ iteration: 0, placed: 0, elapsedMs: 0, sheets: 1, areaUsed: 0, threads });
    r.start(
      { items: plan.items, options: plan.options, locked: plan.locked },
      {
        onProgress: (p) => {
          setProgress(p);
          best.current = { groups: plan.groups, doc: state.doc };
        },
        onDone: (summary) => finish(plan.groups, state.doc, summary),
        onError: (message) => {
          setError(message);
          setProgress(null);
        },
      },
    );
  };

  const finish = (groups: ReturnType<typeof planArrange>['groups'], doc: SheetDocument, summary: ArrangeResult) => {
    runner.current?.close();
    runner.current = null;
    const command = arrangeCommand(groups, summary);
    setProgress(null);
    setResult({ command, summary, further: furtherSheets(doc, groups, summary) });
    onPreview(applyDiff(doc, command.diff));
  };

  const keep = async () => {
    if (!result || making) return;
    if (!kept) {
      store.dispatch(result.command);
      setKept(true);
    }
    if (result.further.length === 0) return close();
    setMaking(true);
    setError(null);
    try {
      setMade(await onFurtherSheets(result.further));
      onPreview(null);
    } catch {
      setError(
        `This sheet is arranged, but the ${result.further.length} new sheet${result.further.length === 1 ? '' : 's'} could not be saved (is the connection down?). Press “Make the new sheets” to try again; nothing here is lost.`,
      );
    } finally {
      setMaking(false);
    }
  };

  /** Stops the search at once and previews the best layout found so far. */
  const stop = () => {
    const r = runner.current;
    if (r?.remote) {
      // The server ends the run with its best so far; the panel hears of it on its next read.
      r.stop();
      setStopping(true);
      return;
    }
    const b = best.current,
      summary = r?.stop();
    if (b && summary) finish(b.groups, b.doc, summary);
    else setProgress(null);
  };

  const close = () => {
    runner.current?.close();
    onPreview(null);
    onClose();
  };

  return (
    <section
      role="dialog"
      aria-labelledby="arrange-title"
      className="absolute right-3 top-3 z-30 w-80 rounded-sticker border-2 border-peel bg-white p-4 text-sm shadow-lg"
    >
      <h2 id="arrange-title" className="mb-2 text-lg font-extrabold">
        Auto-arrange
      </h2>
      <ArrangeOptions
        choice={choice}
        setChoice={setChoice}
        where={where}
        setWhere={setWhere}
        rows={parsed}
        typed={typed}
        setTyped={setTyped}
        disabled={Boolean(result)}
      />
      {!result && waiting > 0 && (
        <p role="status" className="mb-2">
          Waiting for {waiting} outline{waiting === 1 ? '' : 's'}…
        </p>
      )}
      <p className="mb-2 text-xs text-ink-soft">
        {groups.length > 0 && groups.every((g) => g.die)
          ? 'Die-cut stickers are sold one by one, so they may turn a quarter to fit more.'
          : 'Kiss-cut sheets are sold whole, so their stickers stay upright unless you choose turning.'}{' '}
        Quarter turns and any angle may turn art upside down (180°).
      </p>
      {quantityErrors.length > 0 && (
        <ul role="alert" className="mb-2 list-disc pl-4 font-semibold text-alarm">
          {quantityErrors.map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
      {progress && !result && (
        <p role="status" className="mb-2" data-testid="arrange-progress">
          {progress.threads === 0
            ? stopping
              ? 'Stopping on the server…'
              : 'Arranging on the shop’s server…'
            : `Trying layouts on ${progress.threads} thread${progress.threads === 1 ? '' : 's'}… ${progress.iteration} tried;`}{' '}
          the best places {progress.placed} on {progress.sheets} sheet{progress.sheets === 1 ? '' : 's'},{' '}
          {Math.round(progress.areaUsed * 100)} % of the print area.
        </p>
      )}
      {error && (
        <p role="alert" className="mb-2 font-semibold text-alarm">
          {error}
        </p>
      )}
      {result && (
        <p role="status" className="mb-2" data-testid="arrange-summary">
          Preview: {result.summary.placements.filter((p) => p.sheet === 0).length} of {result.summary.requested} placed
          {result.command.diff.added.length > 0 && `, ${result.command.diff.added.length} copies added`} ·{' '}
          {Math.round(result.summary.areaUsed[0] * 100)} % of the print area.
          {result.summary.unplaced.length > 0 && ` ${result.summary.unplaced.map((u) => u.reason).join(' ')}`}
          {result.further.length > 0 &&
            ` The quantity needs ${result.further.length + 1} sheets: ${result.summary.placements.filter((p) => p.sheet > 0).length} more go on ${result.further.length} new sheet${result.further.length === 1 ? '' : 's'}, made when you keep this layout.`}
        </p>
      )}
      {made && (
        <div role="status" className="mb-2" data-testid="arrange-made">
          <p className="font-bold">
            Made {made.length} new sheet{made.length === 1 ? '' : 's'}:
          </p>
          <ul className="list-disc pl-4">
            {made.map((m) => (
              <li key={m.id}>
                <Link to={sheetLink(m.id)} className="underline">
                  {m.name}
                </Link>
              </li>
            ))}
          </ul>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        {running ? (
          <button type="button" onClick={stop} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">
            Stop and keep the best so far
          </button>
        ) : made ? (
          <button type="button" onClick={close} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">
            Done
          </button>
        ) : !result ? (
          <button
            type="button"
            onClick={start}
            disabled={waiting > 0 || quantityErrors.length > 0}
            className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-50"
          >
            Arrange
          </button>
        ) : (
          <>
            <button
              type="button"
              onClick={() => void keep()}
              disabled={making}
              className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-50"
            >
              {making ? 'Making sheets…' : kept ? 'Make the new sheets' : 'Keep this layout'}
            </button>
            <button
              type="button"
              onClick={() => {
                setResult(null);
                onPreview(null);
              }}
              disabled={making || kept}
              className="rounded-full border-2 border-ink px-3 py-1 font-bold"
            >
              Try again
            </button>
          </>
        )}
        {!made && (
          <button type="button" onClick={close} disabled={making} className="rounded-full border-2 border-paper-edge px-3 py-1 font-bold">
            {kept ? 'Close' : result ? 'Discard' : 'Cancel'}
          </button>
        )}
      </div>
    </section>
  );
}
