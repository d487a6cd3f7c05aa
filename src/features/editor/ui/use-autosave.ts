import { useEffect, useRef } from 'react';
import type Konva from 'konva';
import { ApiError } from '../../../lib/api-client';
import { saveSheet } from '../api/sheet';
import type { EditorStore } from '../core/editor-store';

/** A small PNG of the print area for the sheets list. */
function thumbnail(sheet: Konva.Group | null, width: number, height: number): string | undefined {
  if (!sheet) return undefined;
  const scale = sheet.scaleX();
  const pos = sheet.getAbsolutePosition();
  try {
    return sheet.getStage()?.toDataURL({ x: pos.x, y: pos.y, width: width * scale, height: height * scale, pixelRatio: 160 / (width * scale), mimeType: 'image/png' });
  } catch {
    return undefined;
  }
}

/**
 * Saves shortly after each change (800 ms of quiet), one save at a time, based on the version the
 * editor last had. 409 means a teammate saved first: the editor asks what to do. No connection:
 * "offline", retried every 5 s. Leaving with unsaved work warns.
 */
export function useAutosave(
  store: EditorStore,
  teamId: string,
  sheetId: string,
  canEdit: boolean,
  sheetRef: React.MutableRefObject<Konva.Group | null>,
  areaUsed: () => number,
  onSaved: (areaUsed: number) => void,
) {
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);
  const running = useRef(false);
  // Read at save time; kept in a ref so a new function each render does not restart the timer.
  const area = useRef(areaUsed);
  area.current = areaUsed;
  const saved = useRef(onSaved);
  saved.current = onSaved;

  useEffect(() => {
    if (!canEdit) return;
    const run = async () => {
      const state = store.getState();
      if (running.current || state.save === 'saved' || state.save === 'conflict') return;
      running.current = true;
      const sent = { doc: state.doc, meta: state.meta };
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
        else store.saveFailed(!(error instanceof ApiError) || error.status === 0);
      } finally {
        running.current = false;
      }
      const after = store.getState().save;
      if (after === 'unsaved') schedule(800);
      if (after === 'offline') schedule(5000);
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
    const warn = (e: BeforeUnloadEvent) => {
      if (store.getState().save !== 'saved') {
        e.preventDefault();
        e.returnValue = '';
      }
    };
    window.addEventListener('beforeunload', warn);
    return () => {
      unsubscribe();
      clearTimeout(timer.current);
      window.removeEventListener('beforeunload', warn);
    };
  }, [store, teamId, sheetId, canEdit, sheetRef]);
}
