import type { Ring } from '../../../shared/geometry/polygon';
import type { ExportSheet } from './types';

/**
 * The cut lines as AutoCAD R12 ASCII DXF: one closed POLYLINE (flag 70 = 1) per cut line on layer
 * CUT (kiss) or CUT-DIE, in mm or inches, y pointing up from the print area's bottom-left corner as
 * DXF drawings expect.
 */
export function cutDxf(sheet: ExportSheet, lines: Array<{ id: string; ring: Ring; kind: 'kiss' | 'die' }>, unit: 'mm' | 'in'): string {
  const k = unit === 'in' ? 1 / 25.4 : 1;
  const height = sheet.doc.printArea.height;
  const out: Array<string | number> = [];
  const pair = (code: number, value: string | number) => out.push(code, typeof value === 'number' ? Number(value.toFixed(6)) : value);
  pair(999, `Sheetsmith cut lines: ${sheet.name.replace(/[\r\n]/g, ' ')} (${unit})`);
  pair(0, 'SECTION');
  pair(2, 'HEADER');
  pair(9, '$ACADVER');
  pair(1, 'AC1009');
  pair(9, '$EXTMIN');
  pair(10, 0);
  pair(20, 0);
  pair(9, '$EXTMAX');
  pair(10, sheet.doc.printArea.width * k);
  pair(20, height * k);
  pair(0, 'ENDSEC');
  pair(0, 'SECTION');
  pair(2, 'ENTITIES');
  for (const line of lines) {
    pair(0, 'POLYLINE');
    pair(8, line.kind === 'die' ? 'CUT-DIE' : 'CUT');
    pair(66, 1);
    pair(10, 0);
    pair(20, 0);
    pair(30, 0);
    pair(70, 1);
    for (const p of line.ring) {
      pair(0, 'VERTEX');
      pair(8, line.kind === 'die' ? 'CUT-DIE' : 'CUT');
      pair(10, p.x * k);
      pair(20, (height - p.y) * k);
      pair(30, 0);
    }
    pair(0, 'SEQEND');
    pair(8, line.kind === 'die' ? 'CUT-DIE' : 'CUT');
  }
  pair(0, 'ENDSEC');
  pair(0, 'EOF');
  return `${out.join('\r\n')}\r\n`;
}
