import type { SheetDocument } from './document';
import type { Command, Diff } from './commands';
import { applyDiff, invertDiff } from './commands';

const isEmpty = (d: Diff) => d.added.length === 0 && d.updated.length === 0 && d.removed.length === 0;

/** Undo and redo stacks of applied commands. Loading a document from the server never records. */
export class History {
  private undoStack: Command[] = [];
  private redoStack: Command[] = [];

  constructor(private readonly limit = 500) {}

  /** Applies a command, records it and clears redo. Empty commands change nothing and are not kept. */
  apply(doc: SheetDocument, command: Command): SheetDocument {
    if (isEmpty(command.diff)) return doc;
    this.undoStack.push(command);
    if (this.undoStack.length > this.limit) this.undoStack.shift();
    this.redoStack = [];
    return applyDiff(doc, command.diff);
  }

  undo(doc: SheetDocument): SheetDocument {
    const command = this.undoStack.pop();
    if (!command) return doc;
    this.redoStack.push(command);
    return applyDiff(doc, invertDiff(command.diff));
  }

  redo(doc: SheetDocument): SheetDocument {
    const command = this.redoStack.pop();
    if (!command) return doc;
    this.undoStack.push(command);
    return applyDiff(doc, command.diff);
  }

  get canUndo() {
    return this.undoStack.length > 0;
  }

  get canRedo() {
    return this.redoStack.length > 0;
  }

  get nextUndo() {
    return this.undoStack[this.undoStack.length - 1]?.name ?? null;
  }

  get nextRedo() {
    return this.redoStack[this.redoStack.length - 1]?.name ?? null;
  }

  clear() {
    this.undoStack = [];
    this.redoStack = [];
  }
}
