import type Konva from 'konva';
import { memo } from 'react';
import { Group, Image, Path, Rect } from 'react-konva';
import type { Piece } from '@shared/sheet/document';
import type { PieceOutline } from '../api/outlines';
import { useImage } from './use-image';

type Props = {
  piece: Piece;
  outline: PieceOutline | undefined;
  pending: boolean;
  warn: boolean;
  showCutLine: boolean;
  draggable: boolean;
  onSelect: (id: string, additive: boolean) => void;
  onDragStart: (id: string, node: Konva.Group) => void;
  onDragMove: (id: string, node: Konva.Group) => void;
  onDragEnd: (id: string, node: Konva.Group) => void;
};

/** One piece: its bordered raster with the cut line on top, in millimetres (the layer scales). */
export const PieceNode = memo(function PieceNode({
  piece,
  outline,
  pending,
  warn,
  showCutLine,
  draggable,
  onSelect,
  onDragStart,
  onDragMove,
  onDragEnd,
}: Props) {
  const image = useImage(outline?.pngUrl);
  // Until the first outline arrives, an estimate: the art's width plus the border, square.
  const w = outline ? outline.widthMm * (pending ? (piece.width + 2 * piece.border) / outline.widthMm : 1) : piece.width + 2 * piece.border;
  const h = outline ? outline.heightMm * (w / outline.widthMm) : w;
  return (
    <Group
      id={piece.id}
      name="piece"
      x={piece.x}
      y={piece.y}
      rotation={piece.rotation}
      draggable={draggable}
      opacity={pending ? 0.55 : 1}
      onMouseDown={(e) => onSelect(piece.id, e.evt.shiftKey || e.evt.ctrlKey || e.evt.metaKey)}
      onTap={() => onSelect(piece.id, false)}
      onDragStart={(e) => onDragStart(piece.id, e.target as unknown as Konva.Group)}
      onDragMove={(e) => onDragMove(piece.id, e.target as unknown as Konva.Group)}
      onDragEnd={(e) => onDragEnd(piece.id, e.target as unknown as Konva.Group)}
    >
      {image ? (
        <Image image={image} x={-w / 2} y={-h / 2} width={w} height={h} />
      ) : (
        <Rect
          x={-w / 2}
          y={-h / 2}
          width={w}
          height={h}
          cornerRadius={Math.min(w, h) / 6}
          fill="#ffffff"
          stroke="#b8c4c4"
          strokeWidth={1}
          strokeScaleEnabled={false}
          dash={[4, 4]}
        />
      )}
      {outline && showCutLine && (
        <Path
          data={outline.svgPath}
          x={-w / 2}
          y={-h / 2}
          scaleX={w / outline.widthMm}
          scaleY={h / outline.heightMm}
          stroke={warn ? '#c23b3b' : '#d6336c'}
          strokeWidth={warn ? 2.5 : 1.2}
          strokeScaleEnabled={false}
          listening={false}
        />
      )}
      {piece.locked && <Rect x={w / 2 - 4} y={-h / 2} width={4} height={4} fill="#1f3a3d" listening={false} />}
    </Group>
  );
});
