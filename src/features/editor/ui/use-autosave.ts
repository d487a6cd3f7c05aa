import { useEffect, useRef } from 'react';
import type Konva from 'konva';
import { ApiError, KEEPALIVE_MAX_BYTES, sendOnLeave } from '@/lib/api-client';
import { commands } from '@shared/sheet/commands';
import { documentProblems, fitToBounds, refusedPieceIds } from '@shared/sheet/bounds';
import { saveSheet } from '../api/sheet';
import type { EditorStore, SheetMeta } from '../core/editor-store';
import type { SheetDocument } from '@shared/sheet/document';

/** A small PNG of the print area for the sheets list. */
function thumbnail(sheet: Konva.Group | null, width: number, height: number): string | undefined {
  if (!sheet) return undefined;
  const scale = sheet.scaleX();
  const pos = sheet.getAbsolutePosition();
  try {
    return sheet.getStage()?.toDataURL({
      x: pos.x,
      y: pos.y,
      width: width * scale,
      height: height * scale,
      pixelRatio: 160 / (width * scale),
      mimeType: 'image/png',
    });
  } catch {
    return undefined;
  }
}

/**
 * Saves shortly after each change (800 ms of quiet), one save at a time, based on the version the
 * editor last had. 409 means a teammate saved first: the editor asks what to do. No connection:
 * "offline", retried every 5 s. A refusal (400/422) is never retried as it was: the editor says why,
 * marks the pieces, and fits pieces that break the sheet's bounds back onto it (one undoable step),
 * so every later edit saves. Leaving the page sends what is unsaved with a keepalive request, and
 * warns first when that cannot be sent.
 */
export function useAutosave(
  store: EditorStore,
  teamId: string,
  sheetId: string,
  canEdit: boolean,
  sheetRef: React.MutableRefObject<Konva.Group | null>,
  areaUsed: () => number,
  onSaved: (areaUsed: number) => void,
  nameOf?: (pieceId: string) => string,
) {
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);
  const running = useRef(false);
  // Read at save time; kept in a ref so a new function each render does not restart the timer.
  const area = useRef(areaUsed);
  area.current = areaUsed;
  const saved = useRef(onSaved);
  saved.current = onSaved;
  const names = useRef(nameOf);
  names.current = nameOf;

  useEffect(() => {
    if (!canEdit) return;
    const run = async () => {
      const state = store.getState();
      if (running.current || state.save === 'saved' || state.save === 'conflict') return;
      const sent = { doc: state.doc, meta: state.meta };
      // The same rules the server applies, checked here first: no round trip to be refused.
      const problems = documentProblems(sent.doc);
      if (problems.length > 0) {
        refuse(
          sent,
          problems[0].message(sent.meta.unit, names.current?.(problems[0].pieceId)),
          problems.map((p) => p.pieceId),
        );
        return;
      }
      running.current = true;
      store.beginSave();
      try {
        const used = Math.min(1, area.current());
        const result = await saveSheet(teamId, sheetId, {
          version: state.version,
          document: sent.doc,
          ...sent.meta,
          areaUsed: used,
          thumbnail: thumbnail(sheetRef.current, sent.doc.printArea.width, sent.doc.printArea.height),
        });
        store.saveSucceeded(sent, result.version);
        saved.current(used);
      } catch (error) {
        if (error instanceof ApiError && error.status === 409) store.saveFailed(false, error.message);
        else if (error instanceof ApiError && (error.status === 400 || error.status === 422))
          refuse(sent, error.message, refusedPieceIds(error.fields, sent.doc));
        else store.saveFailed(!(error instanceof ApiError) || error.status === 0);
      } finally {
        running.current = false;
      }
      const after = store.getState().save;
      if (after === 'unsaved') schedule(800);
      if (after === 'offline') schedule(5000);
    };
    const refuse = (sent: { doc: SheetDocument; meta: SheetMeta }, message: string, pieceIds: string[]) => {
      const fits = fitToBounds(store.getState().doc);
      store.saveRefused(sent, { message, pieceIds, fitted: fits.size > 0 });
      if (pieceIds.length > 0) store.select(pieceIds);
      if (fits.size > 0) store.dispatch(commands.patchPieces(store.getState().doc, 'Fit to the sheet', fits));
    };
    const schedule = (ms: number) => {
      clearTimeout(timer.current);
      timer.current = setTimeout(() => void run(), ms);
    };
    let last = store.getState();
    const unsubscribe = store.subscribe(() => {
      const next = store.getState();
      if ((next.doc !== last.doc || next.meta !== last.meta || last.save === 'saved') && next.save === 'unsaved') schedule(800);
      last = next;
    });
    // What leaving would send: unsaved, savable work small enough for a keepalive request.
    const leavingBody = () => {
      const state = store.getState();
      if (state.save === 'saved' || state.save === 'conflict' || state.save === 'refused') return null;
      if (state.doc === state.saved.doc && state.meta === state.saved.meta) return null;
      if (documentProblems(state.doc).length > 0) return null;
      return { version: state.version, document: state.doc, ...state.meta };
    };
    const warn = (e: BeforeUnloadEvent) => {
      const state = store.getState();
      const body = leavingBody();
      // Asked only when the work could not go with the page (too large to send on the way out).
      if (state.save !== 'saved' && (!body || new Blob([JSON.stringify(body)]).size > KEEPALIVE_MAX_BYTES)) {
        e.preventDefault();
        e.returnValue = '';
      }
    };
    const flush = () => {
      const body = leavingBody();
      if (body && sendOnLeave('PUT', `/teams/${teamId}/sheets/${sheetId}`, body)) clearTimeout(timer.current);
    };
    window.addEventListener('beforeunload', warn);
    window.addEventListener('pagehide', flush);
    return () => {
      unsubscribe();
      clearTimeout(timer.current);
      window.removeEventListener('beforeunload', warn);
      window.removeEventListener('pagehide', flush);
    };
  }, [store, teamId, sheetId, canEdit, sheetRef]);
}
