import { Group, Line, Rect, Text } from 'react-konva';
import type { LengthUnit } from '@shared/units';

export const RULER = 22;

/** Rulers along the top and left in the sheet's unit, drawn in screen pixels. */
export function Rulers({
  width,
  height,
  originX,
  originY,
  pxPerMm,
  unit,
  sheetW,
  sheetH,
}: {
  width: number;
  height: number;
  originX: number;
  originY: number;
  pxPerMm: number;
  unit: LengthUnit;
  sheetW: number;
  sheetH: number;
}) {
  const unitMm = unit === 'in' ? 25.4 : 10;
  // Minor ticks: 1/8 in or 1 mm, dropped when they would crowd closer than 4 px.
  const minor = unit === 'in' ? 25.4 / 8 : 1;
  const step = minor * pxPerMm < 4 ? unitMm / 2 : minor;
  const ticks = (length: number) => Array.from({ length: Math.floor(length / step) + 1 }, (_, i) => i * step);
  const label = (mm: number) => String(Math.round(mm / unitMm));
  return (
    <Group listening={false}>
      <Rect x={0} y={0} width={width} height={RULER} fill="#f6ead8" />
      <Rect x={0} y={0} width={RULER} height={height} fill="#f6ead8" />
      {ticks(sheetW).map((mm) => {
        const x = originX + mm * pxPerMm;
        const major = Math.abs(mm / unitMm - Math.round(mm / unitMm)) < 1e-6;
        return (
          <Group key={`x${mm}`}>
            <Line points={[x, RULER, x, RULER - (major ? 12 : 5)]} stroke="#3d5a5c" strokeWidth={1} />
            {major && <Text x={x + 2} y={2} text={label(mm)} fontSize={10} fill="#3d5a5c" />}
          </Group>
        );
      })}
      {ticks(sheetH).map((mm) => {
        const y = originY + mm * pxPerMm;
        const major = Math.abs(mm / unitMm - Math.round(mm / unitMm)) < 1e-6;
        return (
          <Group key={`y${mm}`}>
            <Line points={[RULER, y, RULER - (major ? 12 : 5), y]} stroke="#3d5a5c" strokeWidth={1} />
            {major && <Text x={2} y={y + 2} text={label(mm)} fontSize={10} fill="#3d5a5c" />}
          </Group>
        );
      })}
      <Rect x={0} y={0} width={RULER} height={RULER} fill="#e7d6bd" />
      <Text x={3} y={6} text={unit} fontSize={10} fill="#1f3a3d" />
    </Group>
  );
}
