import type { Ring } from '@shared/geometry/polygon';
import type { RegMarks } from './marks';
import { marksExtent, registrationMarks } from './marks';
import type { ExportSheet } from './types';

/**
 * The cut lines as AutoCAD R12 ASCII DXF: one closed POLYLINE (flag 70 = 1) per cut line on layer
 * CUT (kiss) or CUT-DIE (registration marks, when asked, on REGISTRATION), in mm or inches, y pointing up from the print area's bottom-left corner as
 * DXF drawings expect.
 */
export function cutDxf(
  sheet: ExportSheet,
  lines: Array<{ id: string; ring: Ring; kind: 'kiss' | 'die' }>,
  unit: 'mm' | 'in',
  marks: RegMarks | null = null,
): string {
  const k = unit === 'in' ? 1 / 25.4 : 1;
  const height = sheet.doc.printArea.height;
  const out: Array<string | number> = [];
  const pair = (code: number, value: string | number) => out.push(code, typeof value === 'number' ? Number(value.toFixed(6)) : value);
  pair(999, `Sheetsmith cut lines: ${sheet.name.replace(/[\r\n]/g, ' ')} (${unit})`);
  pair(0, 'SECTION');
  pair(2, 'HEADER');
  pair(9, '$ACADVER');
  pair(1, 'AC1009');
  const e = marksExtent(sheet.doc.printArea, marks);
  pair(9, '$EXTMIN');
  pair(10, e.x * k);
  pair(20, (height - e.y - e.height) * k);
  pair(9, '$EXTMAX');
  pair(10, (e.x + e.width) * k);
  pair(20, (height - e.y) * k);
  pair(0, 'ENDSEC');
  pair(0, 'SECTION');
  pair(2, 'ENTITIES');
  // Registration marks (only when asked) on a layer of their own, so the cutter's software can tell them apart.
  const all = [
    ...lines.map((l) => ({ ring: l.ring, layer: l.kind === 'die' ? 'CUT-DIE' : 'CUT' })),
    ...(marks ? registrationMarks(sheet.doc.printArea, marks).map((m) => ({ ring: m.ring, layer: 'REGISTRATION' })) : []),
  ];
  for (const line of all) {
    pair(0, 'POLYLINE');
    pair(8, line.layer);
    pair(66, 1);
    pair(10, 0);
    pair(20, 0);
    pair(30, 0);
    pair(70, 1);
    for (const p of line.ring) {
      pair(0, 'VERTEX');
      pair(8, line.layer);
      pair(10, p.x * k);
      pair(20, (height - p.y) * k);
      pair(30, 0);
    }
    pair(0, 'SEQEND');
    pair(8, line.layer);
  }
  pair(0, 'ENDSEC');
  pair(0, 'EOF');
  return `${out.join('\r\n')}\r\n`;
}
