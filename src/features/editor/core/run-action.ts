// Running the registry's actions: from a button or a menu by name, or from the keyboard (the first
// action whose key test matches). No React or Konva here.
import type { Piece } from '@shared/sheet/document';
import { newPieceId } from '@shared/sheet/commands';
import type { Action, ActionContext } from './actions';
import { ACTIONS } from './actions';

export const enabled = (action: Action, ctx: ActionContext) =>
  !(action.edits && !ctx.canEdit) && (!action.predicate || action.predicate(ctx));

export const actionNamed = (name: string) => ACTIONS.find((a) => a.name === name)!;

export function runAction(name: string, ctx: ActionContext) {
  const action = ACTIONS.find((a) => a.name === name);
  if (!action || !enabled(action, ctx)) return false;
  action.perform(ctx);
  return true;
}

/** Keyboard dispatch: the first action whose keyTest matches and whose predicate holds. */
export function handleKey(event: KeyboardEvent, ctx: ActionContext): boolean {
  for (const action of ACTIONS) {
    if (!action.keyTest?.(event)) continue;
    if (!enabled(action, ctx)) return false;
    action.perform(ctx, event);
    return true;
  }
  return false;
}

export function newPiece(artId: string, x: number, y: number, width: number): Piece {
  return { id: newPieceId(), artId, x, y, rotation: 0, width, border: 3.175, borderColour: '#ffffff', locked: false };
}
