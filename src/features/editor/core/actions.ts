// Every editor action in one registry: the toolbar, the keyboard and the help panel use the same
// entries. No React or Konva here.
import type { Piece } from '@shared/sheet/document';
import { commands } from '@shared/sheet/commands';
import { labelGridForSelection } from '@shared/sheet/label-grid';
import type { EditorStore } from './editor-store';

export type ActionContext = {
  store: EditorStore;
  canEdit: boolean;
  unit: 'in' | 'mm';
  /** Half width and height (mm) of a piece's rotated sticker frame. */
  halfSize: (piece: Piece) => { w: number; h: number };
  /** The zoom last drawn (a number even when the view is "fit"), as the renderer reports it. */
  drawnZoom: () => number;
  /** Opens one of the editor's panels. */
  open: (panel: 'arrange' | 'export') => void;
};

export type Action = {
  name: string;
  label: string;
  /** What a toolbar button shows, when shorter than the label (the label stays its name). */
  short?: string;
  shortcut?: string;
  keyTest?: (event: KeyboardEvent) => boolean;
  /** Needs the right to edit the sheet. */
  edits?: boolean;
  /** Performing it makes an undo step (it changes the document); view changes and panels do not. */
  records: boolean;
  /** For a switch: whether it is on now. */
  checked?: (ctx: ActionContext) => boolean;
  predicate?: (ctx: ActionContext) => boolean;
  perform: (ctx: ActionContext, event?: KeyboardEvent) => void;
};

const mod = (e: KeyboardEvent) => e.ctrlKey || e.metaKey;
const selected = (ctx: ActionContext) => [...ctx.store.getState().selection];
const hasSelection = (ctx: ActionContext) => ctx.store.getState().selection.size > 0;
const gridOf = (ctx: ActionContext) => labelGridForSelection(ctx.store.getState().doc, ctx.store.getState().selection, ctx.halfSize);
/** Small and large nudges: 1/32 in and 1/4 in, or 0.5 mm and 5 mm. */
const nudgeStep = (ctx: ActionContext, large: boolean) => (ctx.unit === 'in' ? (large ? 6.35 : 0.79375) : large ? 5 : 0.5);

function nudge(dx: number, dy: number): Action['perform'] {
  return (ctx, event) => {
    const step = nudgeStep(ctx, Boolean(event?.shiftKey));
    ctx.store.dispatch(commands.movePieces(ctx.store.getState().doc, selected(ctx), dx * step, dy * step));
  };
}

export const ACTIONS: Action[] = [
  {
    name: 'undo',
    label: 'Undo',
    shortcut: 'Ctrl/⌘ Z',
    edits: true,
    records: false,
    keyTest: (e) => mod(e) && !e.shiftKey && e.key.toLowerCase() === 'z',
    predicate: (c) => c.store.history.canUndo,
    perform: (c) => c.store.undo(),
  },
  {
    name: 'redo',
    label: 'Redo',
    shortcut: 'Shift Ctrl/⌘ Z',
    edits: true,
    records: false,
    keyTest: (e) => mod(e) && ((e.shiftKey && e.key.toLowerCase() === 'z') || e.key.toLowerCase() === 'y'),
    predicate: (c) => c.store.history.canRedo,
    perform: (c) => c.store.redo(),
  },
  {
    name: 'select-all',
    label: 'Select all',
    shortcut: 'Ctrl/⌘ A',
    records: false,
    keyTest: (e) => mod(e) && e.key.toLowerCase() === 'a',
    perform: (c) => c.store.select(c.store.getState().doc.pieces.map((p) => p.id)),
  },
  {
    name: 'deselect',
    label: 'Select nothing',
    shortcut: 'Esc',
    records: false,
    keyTest: (e) => e.key === 'Escape',
    perform: (c) => c.store.select([]),
  },
  {
    name: 'delete',
    records: true,
    label: 'Delete',
    shortcut: 'Delete',
    edits: true,
    keyTest: (e) => e.key === 'Delete' || e.key === 'Backspace',
    predicate: hasSelection,
    perform: (c) => c.store.dispatch(commands.removePieces(c.store.getState().doc, selected(c))),
  },
  {
    name: 'duplicate',
    records: true,
    label: 'Duplicate',
    shortcut: 'Ctrl/⌘ D',
    edits: true,
    keyTest: (e) => mod(e) && e.key.toLowerCase() === 'd',
    predicate: hasSelection,
    perform: (c) => c.store.dispatch(commands.duplicatePieces(c.store.getState().doc, selected(c), 5)),
  },
  {
    name: 'label-grid',
    records: true,
    label: 'Fill the sheet with this label (a grid at the sheet’s gap)',
    short: 'Label grid',
    edits: true,
    predicate: (c) => gridOf(c) !== null,
    perform: (c) => {
      const grid = gridOf(c);
      if (grid) c.store.dispatch(grid.command);
    },
  },
  {
    name: 'rotate-cw',
    records: true,
    label: 'Rotate 90° clockwise',
    shortcut: 'R',
    edits: true,
    keyTest: (e) => !mod(e) && !e.shiftKey && e.key.toLowerCase() === 'r',
    predicate: hasSelection,
    perform: (c) => c.store.dispatch(commands.rotatePieces(c.store.getState().doc, selected(c), 90)),
  },
  {
    name: 'rotate-ccw',
    records: true,
    label: 'Rotate 90° counter-clockwise',
    shortcut: 'Shift R',
    edits: true,
    keyTest: (e) => !mod(e) && e.shiftKey && e.key.toLowerCase() === 'r',
    predicate: hasSelection,
    perform: (c) => c.store.dispatch(commands.rotatePieces(c.store.getState().doc, selected(c), -90)),
  },
  {
    name: 'lock',
    label: 'Lock or unlock',
    records: true,
    shortcut: 'L',
    edits: true,
    keyTest: (e) => !mod(e) && e.key.toLowerCase() === 'l',
    predicate: hasSelection,
    perform: (c) => {
      const pieces = c.store.getState().doc.pieces.filter((p) => c.store.getState().selection.has(p.id));
      c.store.dispatch(commands.setLocked(c.store.getState().doc, selected(c), !pieces.every((p) => p.locked)));
    },
  },
  {
    name: 'nudge-left',
    records: true,
    label: 'Nudge left (Shift: further)',
    shortcut: '←',
    edits: true,
    keyTest: (e) => e.key === 'ArrowLeft',
    predicate: hasSelection,
    perform: nudge(-1, 0),
  },
  {
    name: 'nudge-right',
    records: true,
    label: 'Nudge right',
    shortcut: '→',
    edits: true,
    keyTest: (e) => e.key === 'ArrowRight',
    predicate: hasSelection,
    perform: nudge(1, 0),
  },
  {
    name: 'nudge-up',
    records: true,
    label: 'Nudge up',
    shortcut: '↑',
    edits: true,
    keyTest: (e) => e.key === 'ArrowUp',
    predicate: hasSelection,
    perform: nudge(0, -1),
  },
  {
    name: 'nudge-down',
    records: true,
    label: 'Nudge down',
    shortcut: '↓',
    edits: true,
    keyTest: (e) => e.key === 'ArrowDown',
    predicate: hasSelection,
    perform: nudge(0, 1),
  },
  ...(['left', 'centre', 'right', 'top', 'middle', 'bottom'] as const).map((edge): Action => ({
    name: `align-${edge}`,
    label: `Align ${edge}`,
    edits: true,
    records: true,
    predicate: (c) => c.store.getState().selection.size > 1,
    perform: (c) => c.store.dispatch(commands.align(c.store.getState().doc, selected(c), edge, c.halfSize)),
  })),
  {
    name: 'distribute-x',
    records: true,
    label: 'Space evenly across',
    edits: true,
    predicate: (c) => c.store.getState().selection.size > 2,
    perform: (c) => c.store.dispatch(commands.distribute(c.store.getState().doc, selected(c), 'x', c.halfSize)),
  },
  {
    name: 'distribute-y',
    records: true,
    label: 'Space evenly down',
    edits: true,
    predicate: (c) => c.store.getState().selection.size > 2,
    perform: (c) => c.store.dispatch(commands.distribute(c.store.getState().doc, selected(c), 'y', c.halfSize)),
  },
  {
    name: 'zoom-in',
    label: 'Zoom in',
    short: '+',
    shortcut: '+',
    records: false,
    keyTest: (e) => e.key === '+' || e.key === '=',
    perform: (c) => c.store.setView({ zoom: Math.min(8, zoomOf(c) * 1.25) }),
  },
  {
    name: 'zoom-out',
    label: 'Zoom out',
    short: '−',
    shortcut: '−',
    records: false,
    keyTest: (e) => e.key === '-',
    perform: (c) => c.store.setView({ zoom: Math.max(0.1, zoomOf(c) / 1.25) }),
  },
  {
    name: 'zoom-fit',
    label: 'Fit the sheet',
    short: 'Fit',
    shortcut: '0',
    records: false,
    keyTest: (e) => e.key === '0',
    perform: (c) => c.store.setView({ zoom: 'fit', pan: { x: 0, y: 0 } }),
  },
  {
    name: 'zoom-real',
    label: 'Real size (100 %)',
    short: '100 %',
    shortcut: '1',
    records: false,
    keyTest: (e) => e.key === '1',
    perform: (c) => c.store.setView({ zoom: 1 }),
  },
  {
    name: 'cut-lines',
    label: 'Cut lines',
    shortcut: 'C',
    records: false,
    checked: (c) => c.store.getState().showCutLines,
    keyTest: (e) => !mod(e) && e.key.toLowerCase() === 'c',
    perform: (c) => c.store.setView({ showCutLines: !c.store.getState().showCutLines }),
  },
  {
    name: 'arrange',
    label: 'Auto-arrange…',
    shortcut: 'Shift A',
    edits: true,
    records: false,
    keyTest: (e) => !mod(e) && e.shiftKey && e.key.toLowerCase() === 'a',
    perform: (c) => c.open('arrange'),
  },
  {
    name: 'export',
    label: 'Export…',
    shortcut: 'Shift E',
    edits: true,
    records: false,
    keyTest: (e) => !mod(e) && e.shiftKey && e.key.toLowerCase() === 'e',
    perform: (c) => c.open('export'),
  },
  {
    name: 'help',
    label: 'Keyboard shortcuts',
    short: 'Shortcuts (?)',
    shortcut: '?',
    records: false,
    keyTest: (e) => e.key === '?',
    perform: (c) => c.store.setView({ helpOpen: !c.store.getState().helpOpen }),
  },
];

const zoomOf = (c: ActionContext) => {
  const z = c.store.getState().zoom;
  return z === 'fit' ? c.drawnZoom() : z;
};

/** Whether the action can be performed now (rights and predicate). */
