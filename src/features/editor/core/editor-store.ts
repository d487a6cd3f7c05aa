// The editor's state without React or Konva: the sheet document (changed only through commands),
// the selection, the view, and the save state. Renderers read it; they never own it.
import type { Command } from '@shared/sheet/commands';
import type { SheetDocument } from '@shared/sheet/document';
import { History } from '@shared/sheet/history';

export type SaveState = 'saved' | 'unsaved' | 'saving' | 'offline' | 'conflict' | 'refused';
/** Why the server refused the last save, and the pieces it named. */
export type Refusal = { message: string; pieceIds: string[]; fitted: boolean };
export type SheetMeta = { name: string; status: 'draft' | 'ready' | 'printed'; forSale: boolean; unit: 'in' | 'mm'; notes: string };

export type EditorState = {
  doc: SheetDocument;
  meta: SheetMeta;
  selection: ReadonlySet<string>;
  version: number;
  /** What the server has: the document and meta of `version`. */
  saved: { doc: SheetDocument; meta: SheetMeta };
  save: SaveState;
  conflict: string | null;
  refusal: Refusal | null;
  zoom: number | 'fit';
  pan: { x: number; y: number };
  showCutLines: boolean;
  helpOpen: boolean;
};

export class EditorStore {
  private state: EditorState;
  private readonly listeners = new Set<() => void>();
  readonly history = new History();

  constructor(doc: SheetDocument, meta: SheetMeta, version: number) {
    this.state = {
      doc,
      meta,
      selection: new Set(),
      version,
      saved: { doc, meta },
      save: 'saved',
      conflict: null,
      refusal: null,
      zoom: 'fit',
      pan: { x: 0, y: 0 },
      showCutLines: true,
      helpOpen: false,
    };
  }

  getState = () => this.state;

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  private set(change: Partial<EditorState>) {
    this.state = { ...this.state, ...change };
    for (const listener of this.listeners) listener();
  }

  private dirty(doc: SheetDocument, meta: SheetMeta): SaveState {
    if (this.state.save === 'conflict') return 'conflict';
    // A refused save stays refused until something changes; a change is worth trying again.
    if (this.state.save === 'refused' && doc === this.state.doc && meta === this.state.meta) return 'refused';
    return doc === this.state.saved.doc && meta === this.state.saved.meta ? 'saved' : 'unsaved';
  }

  /** Applies a named command, recorded for undo. Selection is kept to pieces that still exist. */
  dispatch(command: Command) {
    const doc = this.history.apply(this.state.doc, command);
    if (doc === this.state.doc) return;
    const ids = new Set(doc.pieces.map((p) => p.id));
    const selection = new Set([...this.state.selection].filter((id) => ids.has(id)));
    for (const added of command.diff.added) selection.add(added.id);
    if (command.diff.added.length) for (const id of [...selection]) if (!command.diff.added.some((p) => p.id === id)) selection.delete(id);
    this.set({ doc, selection, save: this.dirty(doc, this.state.meta) });
  }

  /** Ends the current undo step (a field left, a gesture ended). */
  mark() {
    this.history.mark();
  }

  undo() {
    const doc = this.history.undo(this.state.doc);
    this.set({ doc, save: this.dirty(doc, this.state.meta) });
  }

  redo() {
    const doc = this.history.redo(this.state.doc);
    this.set({ doc, save: this.dirty(doc, this.state.meta) });
  }

  setMeta(change: Partial<SheetMeta>) {
    const meta = { ...this.state.meta, ...change };
    this.set({ meta, save: this.dirty(this.state.doc, meta) });
  }

  /** Selection never touches the history (and never clears redo). */
  select(ids: Iterable<string>) {
    this.set({ selection: new Set(ids) });
  }

  setView(change: Partial<Pick<EditorState, 'zoom' | 'pan' | 'showCutLines' | 'helpOpen'>>) {
    this.set(change);
  }

  /** Loading from the server is not an edit: no history, and the result counts as saved. */
  load(doc: SheetDocument, meta: SheetMeta, version: number) {
    this.history.clear();
    this.set({ doc, meta, version, saved: { doc, meta }, save: 'saved', conflict: null, refusal: null, selection: new Set() });
  }

  /** Derived data (area used, thumbnail) changed although the document did not: save once more. */
  requestSave() {
    if (this.state.save === 'saved') this.set({ save: 'unsaved' });
  }

  beginSave() {
    this.set({ save: 'saving' });
  }

  /** A save of `sent` landed as `version`; changes made meanwhile stay unsaved. */
  saveSucceeded(sent: { doc: SheetDocument; meta: SheetMeta }, version: number) {
    const saved = sent;
    this.state = { ...this.state, saved, version };
    // A refusal the editor fixed by fitting pieces stays on show until dismissed; others are over.
    this.set({
      save: this.state.doc === sent.doc && this.state.meta === sent.meta ? 'saved' : 'unsaved',
      refusal: this.state.refusal?.fitted ? this.state.refusal : null,
    });
  }

  /**
   * The server refused the save of `sent` (a rule the editor did not catch). Nothing is retried
   * until the document or meta changes; the message and the pieces it names stay on show.
   */
  saveRefused(sent: { doc: SheetDocument; meta: SheetMeta }, refusal: Refusal) {
    const changedSince = this.state.doc !== sent.doc || this.state.meta !== sent.meta;
    this.set({ save: changedSince ? 'unsaved' : 'refused', refusal });
  }

  dismissRefusal() {
    this.set({ refusal: null });
  }

  saveFailed(offline: boolean, conflict?: string) {
    if (conflict) this.set({ save: 'conflict', conflict });
    else this.set({ save: offline ? 'offline' : 'unsaved' });
  }
}
