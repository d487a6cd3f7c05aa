import type { SheetDocument } from './document';
import type { Command, Diff } from './commands';
import { applyDiff, composeDiffs, invertDiff } from './commands';

const isEmpty = (d: Diff) => d.added.length === 0 && d.updated.length === 0 && d.removed.length === 0;

/** Undo and redo stacks of applied commands. Loading a document from the server never records. */
export class History {
  private undoStack: Command[] = [];
  private redoStack: Command[] = [];
  /** Whether the top of the undo stack may still take in a following command with its merge key. */
  private open = false;

  constructor(private readonly limit = 500) {}

  /**
   * Applies a command, records it and clears redo. Empty commands change nothing and are not kept.
   * A command with the same merge key as the last one (and no mark between them) joins its undo step.
   */
  apply(doc: SheetDocument, command: Command): SheetDocument {
    if (isEmpty(command.diff)) return doc;
    const top = this.undoStack[this.undoStack.length - 1];
    const joined = this.open && top && command.merge && top.merge === command.merge ? composeDiffs(top.diff, command.diff) : null;
    if (joined) this.undoStack[this.undoStack.length - 1] = { ...top, diff: joined };
    else this.undoStack.push(command);
    if (this.undoStack.length > this.limit) this.undoStack.shift();
    this.redoStack = [];
    this.open = Boolean(command.merge);
    return applyDiff(doc, command.diff);
  }

  /** Ends the current undo step: the next command starts a new one even if it could merge. */
  mark() {
    this.open = false;
  }

  undo(doc: SheetDocument): SheetDocument {
    this.open = false;
    const command = this.undoStack.pop();
    if (!command) return doc;
    this.redoStack.push(command);
    return applyDiff(doc, invertDiff(command.diff));
  }

  redo(doc: SheetDocument): SheetDocument {
    this.open = false;
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
