import { describe, expect, it } from 'vitest';
import type { Piece, SheetDocument } from '@shared/sheet/document';
import type { ActionContext } from './actions';
import { ACTIONS } from './actions';
import { handleKey, runAction } from './run-action';
import { EditorStore } from './editor-store';

const piece = (id: string, x: number): Piece => ({
  id,
  artId: 'a',
  x,
  y: 30 + x / 2,
  rotation: 0,
  width: 30,
  border: 2,
  borderColour: '#ffffff',
  locked: false,
});
const doc = (): SheetDocument => ({
  schemaVersion: 1,
  printArea: { width: 171.45, height: 234.95 },
  safeMargin: 3.175,
  minGap: 3.175,
  pieces: [piece('p1', 40), piece('p2', 70), piece('p3', 140)],
});

function context(canEdit = true) {
  const store = new EditorStore(doc(), { name: 'Test', status: 'draft', forSale: false, unit: 'mm', notes: '' }, 1);
  const opened: string[] = [];
  const ctx: ActionContext = {
    store,
    canEdit,
    unit: 'mm',
    halfSize: () => ({ w: 17, h: 17 }),
    drawnZoom: () => 0.8,
    open: (panel) => opened.push(panel),
  };
  return { store, ctx, opened };
}
const key = (k: string, extra: Partial<KeyboardEvent> = {}) =>
  ({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, ...extra }) as KeyboardEvent;

describe('the action registry', () => {
  it('says truly which actions make an undo step: each is run on three selected pieces', () => {
    for (const action of ACTIONS.filter((a) => a.name !== 'undo' && a.name !== 'redo')) {
      const { store, ctx } = context();
      store.select(action.name === 'label-grid' ? ['p1'] : ['p1', 'p2', 'p3']); // a label grid is made from one piece
      const before = store.getState().doc;
      expect(runAction(action.name, ctx), action.name).toBe(true);
      const changed = store.getState().doc !== before;
      expect(changed, `${action.name} changes the document`).toBe(action.records);
      if (action.records) {
        store.undo();
        expect(store.getState().doc, `${action.name} is undone in one step`).toEqual(before);
      }
    }
  });

  it('zooms from the zoom drawn when the view fits the sheet (no zoom kept outside the store)', () => {
    const { store, ctx } = context();
    expect(store.getState().zoom).toBe('fit');
    runAction('zoom-in', ctx);
    expect(store.getState().zoom).toBeCloseTo(0.8 * 1.25, 9);
  });

  it('opens Auto-arrange and Export from the keyboard for an editor, never for a viewer', () => {
    const editor = context();
    expect(handleKey(key('A', { shiftKey: true }), editor.ctx)).toBe(true);
    expect(handleKey(key('E', { shiftKey: true }), editor.ctx)).toBe(true);
    expect(editor.opened).toEqual(['arrange', 'export']);
    const viewer = context(false);
    expect(handleKey(key('A', { shiftKey: true }), viewer.ctx)).toBe(false);
    expect(runAction('export', viewer.ctx)).toBe(false);
    expect(runAction('delete', viewer.ctx)).toBe(false);
    expect(viewer.opened).toEqual([]);
  });

  it('has one entry per name and a shortcut at most once', () => {
    const names = ACTIONS.map((a) => a.name);
    expect(new Set(names).size).toBe(names.length);
    const shortcuts = ACTIONS.flatMap((a) => (a.shortcut ? [a.shortcut] : []));
    expect(new Set(shortcuts).size).toBe(shortcuts.length);
  });
});
