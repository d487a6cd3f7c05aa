import type Konva from 'konva';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { DragEvent } from 'react';
import { Group, Layer, Rect, Stage, Transformer } from 'react-konva';
import { commands } from '@shared/sheet/commands';
import { formatLength, mmToCssPx, normaliseDegrees } from '@shared/units';
import type { PieceOutline } from '../api/outlines';
import type { EditorState, EditorStore } from '../core/editor-store';
import { DragGesture } from '../core/drag-gesture';
import { PieceNode } from './piece-node';
import { RULER, Rulers } from './rulers';

type Props = {
  store: EditorStore;
  state: EditorState;
  canEdit: boolean;
  outlines: Map<string, { outline: PieceOutline | undefined; pending: boolean }>;
  warnIds: ReadonlySet<string>;
  onDropArt: (data: string, at: { x: number; y: number }) => void;
  stageRef: React.MutableRefObject<Konva.Stage | null>;
  sheetRef: React.MutableRefObject<Konva.Group | null>;
  /** Told the zoom it draws at (a number even when the view is "fit"). */
  onZoom?: (zoom: number) => void;
};

/** The sheet at physical scale (zoom 1 = real size on a 96 DPI screen), with rulers, pieces and selection. */
export function SheetStage({ store, state, canEdit, outlines, warnIds, onDropArt, stageRef, sheetRef, onZoom }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const transformer = useRef<Konva.Transformer>(null);
  const [size, setSize] = useState({ width: 800, height: 600 });
  const [marquee, setMarquee] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const [liveWidth, setLiveWidth] = useState<number | null>(null);
  // The drag itself (who moves, one undo step, Escape) lives in the editor core.
  const drag = useMemo(() => new DragGesture(store), [store]);
  const { doc } = state;

  useEffect(() => {
    const el = box.current!;
    const observer = new ResizeObserver(() => setSize({ width: el.clientWidth, height: el.clientHeight }));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const fitZoom = Math.min(
    (size.width - RULER - 40) / mmToCssPx(doc.printArea.width),
    (size.height - RULER - 40) / mmToCssPx(doc.printArea.height),
  );
  const zoom = state.zoom === 'fit' ? Math.max(0.05, fitZoom) : state.zoom;
  useEffect(() => onZoom?.(zoom), [zoom, onZoom]);
  const pxPerMm = mmToCssPx(1, zoom);
  const origin = {
    x: RULER + 20 + state.pan.x + (state.zoom === 'fit' ? Math.max(0, (size.width - RULER - 40 - doc.printArea.width * pxPerMm) / 2) : 0),
    y: RULER + 20 + state.pan.y,
  };

  // The transformer follows the selection (Konva nodes found by id, never kept in state).
  useEffect(() => {
    const stage = stageRef.current;
    const tr = transformer.current;
    if (!stage || !tr) return;
    const nodes = canEdit ? [...state.selection].map((id) => stage.findOne(`#${id}`)).filter((n): n is Konva.Node => Boolean(n)) : [];
    tr.nodes(nodes.filter((n) => !doc.pieces.find((p) => p.id === n.id())?.locked));
    tr.getLayer()?.batchDraw();
  }, [state.selection, doc, canEdit, stageRef]);

  const select = (id: string, additive: boolean) => {
    const current = store.getState().selection;
    if (additive) store.select(current.has(id) ? [...current].filter((x) => x !== id) : [...current, id]);
    else if (!current.has(id)) store.select([id]);
  };

  const onDragStart = (id: string) => drag.begin(id);
  // Moving one selected piece moves the whole selection with it.
  const onDragMove = (id: string, node: Konva.Group) => {
    for (const [other, pos] of drag.positions(node.position())) if (other !== id) stageRef.current?.findOne(`#${other}`)?.position(pos);
  };
  const onDragEnd = (_id: string, node: Konva.Group) => {
    if (drag.active) drag.end(node.position());
  };

  // Escape during a drag puts everything back where it started.
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape' || !drag.active) return;
      for (const [pid, pos] of drag.cancel()) {
        const node = stageRef.current?.findOne(`#${pid}`);
        node?.stopDrag();
        node?.position(pos);
      }
    };
    window.addEventListener('keydown', onKey, true);
    return () => window.removeEventListener('keydown', onKey, true);
  }, [stageRef, drag]);

  // Live readout of the printed width while a corner handle is dragged.
  const onTransform = () => {
    const node = transformer.current?.nodes()[0];
    const piece = node && doc.pieces.find((p) => p.id === node.id());
    setLiveWidth(piece ? piece.width * Math.abs(node.scaleX()) : null);
  };

  const onTransformEnd = () => {
    setLiveWidth(null);
    const patches = new Map<string, { x: number; y: number; rotation: number; width: number }>();
    for (const node of transformer.current?.nodes() ?? []) {
      const piece = doc.pieces.find((p) => p.id === node.id());
      if (!piece) continue;
      const scale = Math.abs(node.scaleX());
      node.scale({ x: 1, y: 1 });
      patches.set(piece.id, {
        x: node.x(),
        y: node.y(),
        rotation: normaliseDegrees(node.rotation()),
        width: Math.max(2, Math.round(piece.width * scale * 100) / 100),
      });
    }
    store.dispatch(commands.patchPieces(doc, 'Transform', patches));
  };

  const pointerMm = () => sheetRef.current?.getRelativePointerPosition() ?? { x: 0, y: 0 };

  const onMouseDown = (e: Konva.KonvaEventObject<MouseEvent>) => {
    const target = e.target;
    if (target !== stageRef.current && target.name() !== 'print-area') return;
    const p = pointerMm();
    if (!e.evt.shiftKey) store.select([]);
    setMarquee({ x0: p.x, y0: p.y, x1: p.x, y1: p.y });
  };
  const onMouseMove = () => {
    if (!marquee) return;
    const p = pointerMm();
    setMarquee({ ...marquee, x1: p.x, y1: p.y });
  };
  const onMouseUp = () => {
    if (!marquee) return;
    const x0 = Math.min(marquee.x0, marquee.x1),
      x1 = Math.max(marquee.x0, marquee.x1);
    const y0 = Math.min(marquee.y0, marquee.y1),
      y1 = Math.max(marquee.y0, marquee.y1);
    setMarquee(null);
    if (x1 - x0 < 0.5 && y1 - y0 < 0.5) return;
    const hits = doc.pieces.filter((p) => {
      const o = outlines.get(p.id)?.outline;
      const r = Math.max(o?.widthMm ?? p.width, o?.heightMm ?? p.width) / 2;
      return p.x + r > x0 && p.x - r < x1 && p.y + r > y0 && p.y - r < y1;
    });
    store.select([...store.getState().selection, ...hits.map((p) => p.id)]);
  };

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    if (e.evt.ctrlKey || e.evt.metaKey) store.setView({ zoom: Math.min(8, Math.max(0.1, zoom * (e.evt.deltaY < 0 ? 1.1 : 1 / 1.1))) });
    else store.setView({ pan: { x: state.pan.x - e.evt.deltaX, y: state.pan.y - e.evt.deltaY } });
  };

  const onDrop = (event: DragEvent) => {
    const data = event.dataTransfer.getData('application/x-sheetsmith-art');
    if (!data || !canEdit) return;
    event.preventDefault();
    stageRef.current?.setPointersPositions(event);
    onDropArt(data, pointerMm());
  };

  return (
    <div
      ref={box}
      className="relative h-full min-h-[420px] w-full overflow-hidden rounded-sticker border-2 border-paper-edge bg-[#dfe6e5]"
      data-testid="sheet-canvas"
      // Where the print area's corner is and its scale, for tests that aim at a piece.
      data-origin={`${origin.x},${origin.y}`}
      data-px-per-mm={pxPerMm}
      onDragOver={(e) => canEdit && e.preventDefault()}
      onDrop={onDrop}
    >
      <Stage
        ref={stageRef}
        width={size.width}
        height={size.height}
        onMouseDown={onMouseDown}
        onMouseMove={onMouseMove}
        onMouseUp={onMouseUp}
        onWheel={onWheel}
      >
        <Layer>
          <Group ref={sheetRef} x={origin.x} y={origin.y} scaleX={pxPerMm} scaleY={pxPerMm}>
            <Rect
              name="print-area"
              x={0}
              y={0}
              width={doc.printArea.width}
              height={doc.printArea.height}
              fill="#ffffff"
              shadowColor="#1f3a3d"
              shadowBlur={10}
              shadowOpacity={0.25}
            />
            <Rect
              x={doc.safeMargin}
              y={doc.safeMargin}
              width={doc.printArea.width - 2 * doc.safeMargin}
              height={doc.printArea.height - 2 * doc.safeMargin}
              stroke="#9aa8a8"
              strokeWidth={1}
              strokeScaleEnabled={false}
              dash={[6, 4]}
              listening={false}
            />
            {doc.pieces.map((piece) => {
              const o = outlines.get(piece.id);
              return (
                <PieceNode
                  key={piece.id}
                  piece={piece}
                  outline={o?.outline}
                  pending={o?.pending ?? true}
                  warn={warnIds.has(piece.id)}
                  showCutLine={state.showCutLines}
                  draggable={canEdit && !piece.locked}
                  onSelect={select}
                  onDragStart={onDragStart}
                  onDragMove={onDragMove}
                  onDragEnd={onDragEnd}
                />
              );
            })}
            {marquee && (
              <Rect
                x={Math.min(marquee.x0, marquee.x1)}
                y={Math.min(marquee.y0, marquee.y1)}
                width={Math.abs(marquee.x1 - marquee.x0)}
                height={Math.abs(marquee.y1 - marquee.y0)}
                fill="rgba(240,138,93,0.12)"
                stroke="#f08a5d"
                strokeWidth={1}
                strokeScaleEnabled={false}
                listening={false}
              />
            )}
          </Group>
          <Transformer
            ref={transformer}
            keepRatio
            enabledAnchors={['top-left', 'top-right', 'bottom-left', 'bottom-right']}
            rotationSnaps={[0, 90, 180, 270]}
            rotationSnapTolerance={4}
            borderStroke="#f08a5d"
            anchorStroke="#b4532a"
            onTransform={onTransform}
            onTransformEnd={onTransformEnd}
          />
        </Layer>
        <Layer listening={false}>
          <Rulers
            width={size.width}
            height={size.height}
            originX={origin.x}
            originY={origin.y}
            pxPerMm={pxPerMm}
            unit={state.meta.unit}
            sheetW={doc.printArea.width}
            sheetH={doc.printArea.height}
          />
        </Layer>
      </Stage>
      <div className="pointer-events-none absolute bottom-2 right-3 rounded bg-white/80 px-2 text-xs font-bold" data-testid="zoom-readout">
        {Math.round(zoom * 100)} %
      </div>
      {liveWidth !== null && (
        <div
          className="pointer-events-none absolute left-1/2 top-8 -translate-x-1/2 rounded bg-ink px-3 py-1 text-sm font-bold text-paper"
          role="status"
        >
          Art width {formatLength(liveWidth, state.meta.unit)}
        </div>
      )}
    </div>
  );
}
