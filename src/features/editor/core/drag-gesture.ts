// Dragging pieces as one gesture, apart from the canvas that draws it: where each dragged piece
// would be for the pointer's move, one undo step when the drag ends (pieces dropped far off the
// sheet stop at the edge of where pieces may sit), and Escape putting every piece back where the
// drag began with nothing recorded. No React or Konva here.
import { clampToZone } from '@shared/sheet/bounds';
import { commands } from '@shared/sheet/commands';
import type { EditorStore } from './editor-store';

type Point = { x: number; y: number };

export class DragGesture {
  private start = new Map<string, Point>();
  private lead: string | null = null;

  constructor(private readonly store: EditorStore) {}

  get active() {
    return this.start.size > 0;
  }

  /** Starts dragging `id`, taking the rest of the selection along. */
  begin(id: string) {
    const { doc, selection } = this.store.getState();
    this.start = new Map(doc.pieces.filter((p) => selection.has(p.id) || p.id === id).map((p) => [p.id, { x: p.x, y: p.y }]));
    this.lead = id;
  }

  /** Where every dragged piece is drawn when the lead piece is at `at` (nothing recorded yet). */
  positions(at: Point): Map<string, Point> {
    const origin = this.lead ? this.start.get(this.lead) : undefined;
    if (!origin) return new Map();
    const dx = at.x - origin.x,
      dy = at.y - origin.y;
    return new Map([...this.start].map(([id, p]) => [id, { x: p.x + dx, y: p.y + dy }]));
  }

  /** Ends the drag with the lead piece at `at`: one undo step for every piece moved. */
  end(at: Point) {
    const doc = this.store.getState().doc;
    const moved = new Map([...this.positions(at)].map(([id, p]) => [id, clampToZone(doc, p.x, p.y)]));
    this.reset();
    if (moved.size) this.store.dispatch(commands.placePieces(doc, moved));
  }

  /** Escape: where every piece was when the drag began; the document and its history are untouched. */
  cancel(): Map<string, Point> {
    const back = new Map(this.start);
    this.reset();
    return back;
  }

  private reset() {
    this.start = new Map();
    this.lead = null;
  }
}
