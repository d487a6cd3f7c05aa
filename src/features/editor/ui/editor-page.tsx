import type Konva from 'konva';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { ArtView } from '@shared/schemas/library';
import type { SheetDetail } from '@shared/schemas/sheets';
import { commands } from '@shared/sheet/commands';
import { preflight } from '@shared/sheet/preflight';
import { rotatedHalfSize } from '@shared/sheet/placement';
import { usePieceOutlines } from '../api/outlines';
import { saveAsCopy } from '../api/sheet';
import type { ActionContext } from '../core/actions';
import { handleKey, newPiece } from '../core/run-action';
import { Toolbar } from './toolbar';
import { firstFreeSpot } from '../core/arrange-plan';
import { SheetStage } from '../render/sheet-stage';
import { PreflightPanel } from './preflight-panel';
import { CostPanel } from './cost-panel';
import { HelpPanel } from './help-panel';
import { Inspector } from './inspector';
import { LibraryPanel, defaultWidthMm } from './library-panel';
import { useEditorSession, useSheetSaving } from './use-editor-session';
import { SheetHeader } from './sheet-header';
import { ConflictDialog } from './conflict-dialog';
import { ContextMenu } from './context-menu';
import { ArrangePanel } from './arrange-panel';
import { ExportPanel } from './export-panel';
import type { SheetDocument } from '@shared/sheet/document';
import { pieceName } from '@shared/sheet/document';
import { formatLength } from '@shared/units';

export function EditorPage({ teamId, sheet, canEdit }: { teamId: string; sheet: SheetDetail; canEdit: boolean }) {
  const session = useEditorSession(teamId, sheet, canEdit);
  const { store, state } = session;
  const [arranging, setArranging] = useState(false);
  const [exporting, setExporting] = useState(false);
  const [preview, setPreview] = useState<SheetDocument | null>(null);
  const [menuAt, setMenuAt] = useState<{ x: number; y: number } | null>(null);
  const stageRef = useRef<Konva.Stage | null>(null);
  const sheetRef = useRef<Konva.Group | null>(null);
  const [artNames] = useState(() => new Map<string, string>(Object.entries(sheet.artNames)));
  const [artLicences] = useState(() => new Map<string, string | null>(Object.entries(sheet.artLicences)));
  // While an arrange preview is shown, everything drawn and measured is the preview's.
  const shown = preview ?? state.doc;
  const { outlines } = usePieceOutlines(teamId, shown.pieces, sheet.limits);
  const unit = state.meta.unit;

  const sizes = useMemo(() => {
    const map = new Map<string, { widthMm: number; heightMm: number }>();
    for (const p of shown.pieces) {
      const entry = outlines.get(p.id);
      const o = entry?.outline;
      // While a new outline is on its way, the frame is the new size at the old outline's proportions
      // (art + a border each side), so sizes and X/Y read right at once, not a moment later.
      const w = p.width + 2 * p.border;
      map.set(
        p.id,
        o && !entry.pending ? { widthMm: o.widthMm, heightMm: o.heightMm } : { widthMm: w, heightMm: o ? (w * o.heightMm) / o.widthMm : w },
      );
    }
    return map;
  }, [shown.pieces, outlines]);

  const drawnZoom = useRef(1);
  const onZoom = useCallback((zoom: number) => {
    drawnZoom.current = zoom;
  }, []);
  const ctx: ActionContext = useMemo(
    () => ({
      store,
      canEdit,
      unit,
      halfSize: (p) => rotatedHalfSize(sizes.get(p.id)?.widthMm ?? p.width, sizes.get(p.id)?.heightMm ?? p.width, p.rotation),
      drawnZoom: () => drawnZoom.current,
      open: (panel) => (panel === 'arrange' ? setArranging(true) : setExporting(true)),
    }),
    [store, canEdit, unit, sizes],
  );

  const findings = useMemo(() => {
    const ready = new Map([...outlines].filter(([, o]) => o.outline && !o.pending).map(([id, o]) => [id, o.outline!]));
    return preflight({
      doc: shown,
      outlines: ready,
      unit,
      limits: sheet.limits,
      forSale: state.meta.forSale,
      licenceOf: (p) => artLicences.get(p.artId),
      name: (p) => name(p.id),
    });
  }, [shown, outlines, unit, state.meta.forSale]); // eslint-disable-line react-hooks/exhaustive-deps
  const warnIds = useMemo(
    () => new Set([...findings.filter((f) => f.severity !== 'notice').flatMap((f) => f.pieceIds), ...(state.refusal?.pieceIds ?? [])]),
    [findings, state.refusal],
  );
  const areaUsed = useCallback(() => {
    const total = shown.pieces.reduce((sum, p) => sum + (outlines.get(p.id)?.outline?.areaMm2 ?? 0), 0);
    return total / (shown.printArea.width * shown.printArea.height);
  }, [shown, outlines]);

  const allOutlined = !preview && state.doc.pieces.every((p) => outlines.get(p.id)?.outline && !outlines.get(p.id)?.pending);
  useSheetSaving(session, teamId, sheet, canEdit, { sheetRef, areaUsed, allOutlined, name: (id) => name(id) });

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const target = e.target as HTMLElement;
      if (target.closest('input, textarea, select, [contenteditable], [role=menu]')) return;
      // The context menu from the keyboard: the Menu key or Shift+F10, as desktop applications do.
      if (e.key === 'ContextMenu' || (e.shiftKey && e.key === 'F10')) {
        e.preventDefault();
        setMenuAt({ x: 24, y: 24 });
        return;
      }
      if (handleKey(e, ctx)) e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [ctx]);

  const addArt = (art: { artId: string; widthPx: number; heightPx?: number }, at?: { x: number; y: number }) => {
    const doc = store.getState().doc;
    const piece = newPiece(art.artId, 0, 0, Math.round(defaultWidthMm(art) * 100) / 100);
    // Dropped at a point: there. Added from the panel: the first free spot for a sticker that size.
    const aspect = art.heightPx && art.widthPx ? art.heightPx / art.widthPx : 1;
    const spot =
      at ?? firstFreeSpot(doc, outlines, { widthMm: piece.width + 2 * piece.border, heightMm: piece.width * aspect + 2 * piece.border });
    store.dispatch(commands.addPieces([{ ...piece, x: spot.x, y: spot.y }]));
  };
  const onAddFromPanel = (item: ArtView) => {
    artNames.set(item.id, item.name);
    artLicences.set(item.id, item.licence?.kind ?? null);
    addArt({ artId: item.id, widthPx: item.widthPx, heightPx: item.heightPx });
  };

  const selectedPieces = state.doc.pieces.filter((p) => state.selection.has(p.id));
  // A declaration (hoisted): the preflight above names pieces through it during the same render.
  function name(id: string) {
    return pieceName(shown, id, (artId) => artNames.get(artId));
  }

  return (
    <div className="flex h-[calc(100vh-7.5rem)] min-h-[560px] flex-col gap-3">
      <SheetHeader store={store} state={state} canEdit={canEdit} />
      <Toolbar
        ctx={ctx}
        names={['undo', 'redo', 'zoom-fit', 'zoom-real', 'zoom-out', 'zoom-in', 'cut-lines', 'arrange', 'export', 'help']}
        open={[...(arranging ? ['arrange'] : []), ...(exporting ? ['export'] : [])]}
        after={{
          name: 'export',
          node: (
            <span className="ml-auto text-xs text-ink-soft" data-testid="area-used">
              {shown.pieces.length} piece{shown.pieces.length === 1 ? '' : 's'} · {Math.round(areaUsed() * 100)} % of the print area
              {preview ? ' (preview)' : ''}
            </span>
          ),
        }}
      />
      <div className="grid min-h-0 flex-1 gap-3 lg:grid-cols-[13rem_1fr_17rem]">
        <LibraryPanel teamId={teamId} canEdit={canEdit} onAdd={onAddFromPanel} />
        <div
          className="relative min-h-0 min-w-0"
          onContextMenu={(e) => {
            if (preview) return;
            e.preventDefault();
            const box = e.currentTarget.getBoundingClientRect();
            setMenuAt({ x: e.clientX - box.left, y: e.clientY - box.top });
          }}
        >
          {menuAt && <ContextMenu ctx={ctx} at={menuAt} onClose={() => setMenuAt(null)} />}
          <SheetStage
            store={store}
            state={preview ? { ...state, doc: preview } : state}
            canEdit={canEdit && !preview}
            outlines={outlines}
            warnIds={warnIds}
            stageRef={stageRef}
            sheetRef={sheetRef}
            onZoom={onZoom}
            onDropArt={(data, at) => {
              const art = JSON.parse(data) as { artId: string; widthPx: number; name?: string };
              if (art.name) artNames.set(art.artId, art.name);
              addArt(art, at);
            }}
          />
          {exporting && (
            <ExportPanel
              teamId={teamId}
              sheetId={sheet.id}
              unsaved={state.save !== 'saved'}
              findings={findings}
              areaText={`${formatLength(state.doc.printArea.width, unit)} × ${formatLength(state.doc.printArea.height, unit)}`}
              printing={sheet.printing}
              formatLength={(mm) => formatLength(mm, unit)}
              onClose={() => setExporting(false)}
            />
          )}
          {arranging && (
            <ArrangePanel
              store={store}
              outlines={outlines}
              nameOf={(id) => artNames.get(id) ?? 'Piece'}
              onPreview={setPreview}
              onFurtherSheets={async (docs) => {
                const s = store.getState();
                const made: Array<{ id: string; name: string }> = [];
                for (const [i, doc] of docs.entries()) {
                  const name = `${s.meta.name.slice(0, 100)} · sheet ${i + 2} of ${docs.length + 1}`;
                  made.push({ id: await saveAsCopy(teamId, name, s.meta.unit, doc), name });
                }
                return made;
              }}
              sheetLink={(id) => `/t/${teamId}/sheets/${id}`}
              serverRuns={`/teams/${teamId}/sheets/${sheet.id}/arrange-runs`}
              onClose={() => setArranging(false)}
            />
          )}
        </div>
        <aside
          className="flex min-h-0 flex-col gap-4 overflow-auto rounded-sticker border-2 border-paper-edge bg-white p-3"
          aria-label="Selection and checks"
        >
          <section aria-labelledby="sel-title">
            <h2 id="sel-title" className="mb-2 text-sm font-extrabold uppercase tracking-wide text-ink-faint">
              Selection
            </h2>
            <Inspector ctx={ctx} pieces={selectedPieces} sizes={sizes} />
          </section>
          <details>
            <summary className="cursor-pointer text-sm font-extrabold uppercase tracking-wide text-ink-faint">Notes</summary>
            <textarea
              aria-label="Sheet notes"
              value={state.meta.notes}
              disabled={!canEdit}
              onChange={(e) => store.setMeta({ notes: e.target.value })}
              rows={4}
              className="mt-2 w-full rounded border-2 border-paper-edge px-2 py-1 text-sm"
              placeholder="Stock, printer settings, who it is for…"
            />
          </details>
          <section aria-labelledby="preflight-title">
            <h2 id="preflight-title" className="mb-2 text-sm font-extrabold uppercase tracking-wide text-ink-faint">
              Preflight
            </h2>
            <PreflightPanel findings={findings} onSelect={(ids) => store.select(ids)} />
          </section>
          <details>
            <summary className="cursor-pointer text-sm font-extrabold uppercase tracking-wide text-ink-faint">Cost</summary>
            <CostPanel teamId={teamId} sheetId={sheet.id} version={state.version} canEdit={canEdit} />
          </details>
        </aside>
      </div>
      {state.helpOpen && <HelpPanel onClose={() => store.setView({ helpOpen: false })} />}
      {state.save === 'conflict' && <ConflictDialog message={state.conflict} keepCopy={session.keepCopy} loadTheirs={session.loadTheirs} />}
    </div>
  );
}
