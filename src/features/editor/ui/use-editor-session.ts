// The editor's session with the server: one store per sheet, saving (use-autosave.ts), the second
// save once outlines have arrived, asking before leaving with unsaved work, and the two ways out of
// a conflict (keep mine as a copy, load theirs). The page draws; this owns the sheet's life.
import type Konva from 'konva';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useSyncExternalStore } from 'react';
import type { RefObject } from 'react';
import { useBlocker, useNavigate } from 'react-router';
import type { SheetDetail } from '@shared/schemas/sheets';
import { saveAsCopy, sheetQueryOptions } from '../api/sheet';
import { EditorStore } from '../core/editor-store';
import type { EditorState } from '../core/editor-store';
import { useAutosave } from './use-autosave';

const metaOf = (s: SheetDetail) => ({ name: s.name, status: s.status, forSale: s.forSale, unit: s.unit, notes: s.notes });

type EditorSession = {
  store: EditorStore;
  state: EditorState;
  /** A conflict's way out: the teammate's saved version replaces this one. */
  loadTheirs: () => Promise<void>;
  /** A conflict's way out: this version becomes a new sheet, opened at once. */
  keepCopy: () => Promise<void>;
};

export function useEditorSession(teamId: string, sheet: SheetDetail, canEdit: boolean): EditorSession {
  // One store per sheet: a refetch of the same sheet must not throw away the edits in it.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const store = useMemo(() => new EditorStore(sheet.document, metaOf(sheet), sheet.version), [sheet.id]);
  const state = useSyncExternalStore(store.subscribe, store.getState);
  const client = useQueryClient();
  const navigate = useNavigate();

  // Leaving for another page of the app with unsaved work asks first (reloads are asked by the browser).
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) =>
      canEdit && state.save !== 'saved' && state.save !== 'conflict' && currentLocation.pathname !== nextLocation.pathname,
  );
  useEffect(() => {
    if (blocker.state !== 'blocked') return;
    if (window.confirm('This sheet has changes that are not saved yet. Leave anyway?')) blocker.proceed();
    else blocker.reset();
  }, [blocker]);

  const loadTheirs = async () => {
    const fresh = await client.fetchQuery({ ...sheetQueryOptions(teamId, sheet.id), staleTime: 0 });
    store.load(fresh.document, metaOf(fresh), fresh.version);
  };
  const keepCopy = async () => {
    const s = store.getState();
    const id = await saveAsCopy(teamId, `${s.meta.name} (my copy)`, s.meta.unit, s.doc);
    store.load(s.doc, s.meta, s.version); // nothing left to save here; the copy has it
    navigate(`/t/${teamId}/sheets/${id}`);
  };
  return { store, state, loadTheirs, keepCopy };
}

/**
 * Saves the session's sheet as it changes, with the area used and a thumbnail. Both depend on
 * outlines, which arrive after the pieces: once all have arrived and the saved figure is off, it
 * saves once more (no document change, no undo step).
 */
export function useSheetSaving(
  session: EditorSession,
  teamId: string,
  sheet: SheetDetail,
  canEdit: boolean,
  drawn: { sheetRef: RefObject<Konva.Group | null>; areaUsed: () => number; allOutlined: boolean; name: (pieceId: string) => string },
) {
  const { store } = session;
  const savedArea = useRef(sheet.areaUsed);
  useAutosave(
    store,
    teamId,
    sheet.id,
    canEdit,
    drawn.sheetRef,
    drawn.areaUsed,
    (used) => {
      savedArea.current = used;
    },
    drawn.name,
  );
  const currentArea = drawn.areaUsed();
  useEffect(() => {
    if (!canEdit || !drawn.allOutlined || Math.abs(currentArea - savedArea.current) < 0.002) return;
    // Images need a moment to paint before the thumbnail is taken.
    const handle = setTimeout(() => store.requestSave(), 600);
    return () => clearTimeout(handle);
  }, [drawn.allOutlined, currentArea, canEdit, store]);
}
