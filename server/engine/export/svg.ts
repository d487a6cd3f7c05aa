import type { Ring } from '@shared/geometry/polygon';
import { ringToSvgPath } from '@shared/geometry/polygon';
import type { RegMarks } from './marks';
import { marksExtent, registrationMarks } from './marks';
import type { ExportSheet } from './types';

const num = (v: number) => Number(v.toFixed(4)).toString();
const escape = (text: string) => text.replace(/[<&>"]/g, (c) => ({ '<': '&lt;', '&': '&amp;', '>': '&gt;', '"': '&quot;' })[c]!);

/**
 * width, height and viewBox in the sheet's unit (CSS/SVG absolute units: 1in = 25.4mm). User space
 * always has its origin at the print area's top-left; with registration marks the view widens to
 * take them in (negative coordinates), so the cut lines never move.
 */
function frame(sheet: ExportSheet, marks: RegMarks | null = null) {
  const k = sheet.unit === 'in' ? 1 / 25.4 : 1;
  const e = marksExtent(sheet.doc.printArea, marks);
  const w = num(e.width * k),
    h = num(e.height * k);
  return {
    k,
    open: `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${w}${sheet.unit}" height="${h}${sheet.unit}" viewBox="${num(e.x * k)} ${num(e.y * k)} ${w} ${h}">`,
  };
}

/** The marks as filled black paths (printed) or as outlines (for a cutter's software to find). */
function markGroup(sheet: ExportSheet, marks: RegMarks | null, k: number, style: 'print' | 'outline'): string[] {
  if (!marks) return [];
  const paint = style === 'print' ? 'fill="#000000"' : `fill="none" stroke="#000000" stroke-width="${num(0.25 * k)}"`;
  return [
    `  <g id="registration-marks" ${paint}>`,
    ...registrationMarks(sheet.doc.printArea, marks).map(
      (m) => `    <path id="mark-${m.corner}" d="${ringToSvgPath(scaled(m.ring, k), 4)}"/>`,
    ),
    '  </g>',
  ];
}

const scaled = (ring: Ring, k: number) => ring.map((p) => ({ x: p.x * k, y: p.y * k }));

function cutGroups(lines: Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }>, k: number, strokeWidth: number) {
  const group = (kind: 'kiss' | 'die', label: string) => {
    const paths = lines
      .filter((l) => l.kind === kind)
      .map((l) => `    <path id="cut-${escape(l.id)}" data-name="${escape(l.name)}" d="${ringToSvgPath(scaled(l.ring, k), 4)}"/>`);
    return paths.length ? [`  <g id="${label}" fill="none" stroke="#ff00ff" stroke-width="${num(strokeWidth)}">`, ...paths, '  </g>'] : [];
  };
  return [...group('kiss', 'kiss-cut'), ...group('die', 'die-cut')];
}

/** The cut file: one closed stroked path per piece in sheet coordinates, kiss and die cuts grouped. */
export function cutSvg(
  sheet: ExportSheet,
  lines: Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }>,
  marks: RegMarks | null = null,
): string {
  const { k, open } = frame(sheet, marks);
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    open,
    `  <title>${escape(sheet.name)}: cut lines</title>`,
    ...markGroup(sheet, marks, k, 'outline'),
    ...cutGroups(lines, k, 0.25 * k),
    '</svg>',
    '',
  ].join('\n');
}

/** The print image embedded under the cut lines, in separate named groups. */
export function combinedSvg(
  sheet: ExportSheet,
  lines: Array<{ id: string; name: string; ring: Ring; kind: 'kiss' | 'die' }>,
  printPng: Buffer,
  marks: RegMarks | null = null,
): string {
  const { k, open } = frame(sheet, marks);
  const w = num(sheet.doc.printArea.width * k),
    h = num(sheet.doc.printArea.height * k);
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    open,
    `  <title>${escape(sheet.name)}</title>`,
    `  <g id="print"><image x="0" y="0" width="${w}" height="${h}" preserveAspectRatio="none" xlink:href="data:image/png;base64,${printPng.toString('base64')}"/></g>`,
    ...markGroup(sheet, marks, k, 'print'),
    `  <g id="cut-lines">`,
    ...cutGroups(lines, k, 0.25 * k).map((l) => `  ${l}`),
    '  </g>',
    '</svg>',
    '',
  ].join('\n');
}
