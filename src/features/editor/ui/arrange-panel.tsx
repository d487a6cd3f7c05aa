import { useRef, useState } from 'react';
import type { ArrangeProgress, ArrangeResult } from '../../../../shared/arrange/nester';
import { applyDiff } from '../../../../shared/sheet/commands';
import type { Command } from '../../../../shared/sheet/commands';
import type { PieceOutline } from '../api/outlines';
import type { ArrangeChoice } from '../core/arrange-plan';
import { arrangeCommand, planArrange } from '../core/arrange-plan';
import type { EditorStore } from '../core/editor-store';

/**
 * Arrange options, a run in a Web Worker with progress, then a preview on the canvas that the user
 * keeps (one undo step) or throws away.
 */
export function ArrangePanel({ store, outlines, onPreview, onClose }: { store: EditorStore; outlines: Map<string, { outline: PieceOutline | undefined }>; onPreview: (doc: ReturnType<EditorStore['getState']>['doc'] | null) => void; onClose: () => void }) {
  const [choice, setChoice] = useState<ArrangeChoice>({ scope: store.getState().selection.size > 1 ? 'selection' : 'sheet', rotate: '90', fill: false, seconds: 2, seed: 1 });
  const [progress, setProgress] = useState<ArrangeProgress | null>(null);
  const [result, setResult] = useState<{ command: Command; summary: ArrangeResult } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const worker = useRef<Worker | null>(null);
  const best = useRef<{ result: ArrangeResult; groups: ReturnType<typeof planArrange>['groups']; doc: ReturnType<EditorStore['getState']>['doc'] } | null>(null);
  const running = progress !== null && !result && !error;

  const state0 = store.getState();
  const waiting = state0.doc.pieces.filter((p) => !p.locked && (choice.scope === 'sheet' || state0.selection.has(p.id)) && !outlines.get(p.id)?.outline).length;

  const start = () => {
    setError(null);
    setResult(null);
    const state = store.getState();
    const plan = planArrange(state.doc, state.selection, outlines, choice);
    if (plan.items.length === 0) {
      setError('Nothing to arrange: choose pieces that are not locked, and wait for their outlines.');
      return;
    }
    worker.current?.terminate();
    const w = new Worker(new URL('../core/arrange.worker.ts', import.meta.url), { type: 'module' });
    worker.current = w;
    best.current = null;
    w.onmessage = (event) => {
      const message = event.data;
      if (message.type === 'progress') setProgress(message.progress);
      if (message.type === 'best') best.current = { result: message.result, groups: plan.groups, doc: state.doc };
      if (message.type === 'error') setError(message.message);
      if (message.type === 'done') finish(plan.groups, state.doc, message.result);
    };
    w.postMessage({ items: plan.items, options: plan.options, locked: plan.locked });
  };

  const finish = (groups: ReturnType<typeof planArrange>['groups'], doc: ReturnType<EditorStore['getState']>['doc'], summary: ArrangeResult) => {
    worker.current?.terminate();
    worker.current = null;
    const command = arrangeCommand(groups, summary);
    setProgress(null);
    setResult({ command, summary });
    onPreview(applyDiff(doc, command.diff));
  };

  /** Stops the search at once and previews the best layout found so far. */
  const stop = () => {
    const b = best.current;
    if (b) finish(b.groups, b.doc, b.result);
    else {
      worker.current?.terminate();
      setProgress(null);
    }
  };

  const close = () => {
    worker.current?.terminate();
    onPreview(null);
    onClose();
  };

  return (
    <section role="dialog" aria-labelledby="arrange-title" className="absolute right-3 top-3 z-30 w-80 rounded-sticker border-2 border-peel bg-white p-4 text-sm shadow-lg">
      <h2 id="arrange-title" className="mb-2 text-lg font-extrabold">Auto-arrange</h2>
      <fieldset className="mb-2 flex flex-col gap-2" disabled={Boolean(result)}>
        <label className="flex items-center justify-between font-bold">
          Pieces
          <select value={choice.scope} onChange={(e) => setChoice({ ...choice, scope: e.target.value as ArrangeChoice['scope'] })} className="rounded border-2 border-paper-edge px-1">
            <option value="sheet">Whole sheet</option>
            <option value="selection">Selection only</option>
          </select>
        </label>
        <label className="flex items-center justify-between font-bold">
          Turning
          <select value={typeof choice.rotate === 'object' ? ('step' in choice.rotate ? `step${choice.rotate.step}` : '90') : choice.rotate} onChange={(e) => setChoice({ ...choice, rotate: e.target.value === 'none' ? 'none' : e.target.value === '90' ? '90' : { step: Number(e.target.value.slice(4)) } })} className="rounded border-2 border-paper-edge px-1">
            <option value="none">Keep upright</option>
            <option value="90">Quarter turns</option>
            <option value="step15">Any angle, 15° steps</option>
          </select>
        </label>
        <label className="flex items-center gap-2 font-bold"><input type="checkbox" checked={choice.fill} onChange={(e) => setChoice({ ...choice, fill: e.target.checked })} />Fill the sheet with more copies</label>
        <label className="flex items-center justify-between font-bold">
          Try for
          <select value={choice.seconds} onChange={(e) => setChoice({ ...choice, seconds: Number(e.target.value) })} className="rounded border-2 border-paper-edge px-1">
            {[1, 2, 5, 10].map((s) => <option key={s} value={s}>{s} s</option>)}
          </select>
        </label>
      </fieldset>
      {waiting > 0 && <p role="status" className="mb-2">Waiting for {waiting} outline{waiting === 1 ? '' : 's'}…</p>}
      <p className="mb-2 text-xs text-ink-soft">Quarter turns and any angle may turn art upside down (180°): keep stickers upright for sheets sold whole.</p>
      {progress && !result && (
        <p role="status" className="mb-2" data-testid="arrange-progress">
          Trying layouts… {progress.iteration} tried; the best places {progress.placed} on {progress.sheets} sheet{progress.sheets === 1 ? '' : 's'}, {Math.round(progress.areaUsed * 100)} % of the print area.
        </p>
      )}
      {error && <p role="alert" className="mb-2 font-semibold text-alarm">{error}</p>}
      {result && (
        <p role="status" className="mb-2" data-testid="arrange-summary">
          Preview: {result.summary.placements.filter((p) => p.sheet === 0).length} of {result.summary.requested} placed
          {result.command.diff.added.length > 0 && `, ${result.command.diff.added.length} copies added`} · {Math.round(result.summary.areaUsed[0] * 100)} % of the print area.
          {result.summary.unplaced.length > 0 && ` ${result.summary.unplaced.map((u) => u.reason).join(' ')}`}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        {running ? (
          <button type="button" onClick={stop} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">Stop and keep the best so far</button>
        ) : !result ? (
          <button type="button" onClick={start} disabled={waiting > 0} className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-50">Arrange</button>
        ) : (
          <>
            <button type="button" onClick={() => { store.dispatch(result.command); close(); }} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">Keep this layout</button>
            <button type="button" onClick={() => { setResult(null); onPreview(null); }} className="rounded-full border-2 border-ink px-3 py-1 font-bold">Try again</button>
          </>
        )}
        <button type="button" onClick={close} className="rounded-full border-2 border-paper-edge px-3 py-1 font-bold">{result ? 'Discard' : 'Cancel'}</button>
      </div>
    </section>
  );
}
