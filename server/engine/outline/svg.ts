import type { OutlinePiece } from './outline';

const num = (v: number) => Number(v.toFixed(4)).toString();

/**
 * The cut line alone as an SVG document: width and height in millimetres and a viewBox in the same
 * unit (CSS/SVG absolute units: 1in = 25.4mm), one closed stroked path, no fill.
 */
export function cutLineSvg(piece: Pick<OutlinePiece, 'widthMm' | 'heightMm' | 'cutLine'>, title = 'Cut line'): string {
  const w = num(piece.widthMm),
    h = num(piece.heightMm);
  return [
    `<?xml version="1.0" encoding="UTF-8"?>`,
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}mm" height="${h}mm" viewBox="0 0 ${w} ${h}">`,
    `  <title>${title.replace(/[<&>"]/g, '')}</title>`,
    `  <path id="cut-line" d="${piece.cutLine.svgPath}" fill="none" stroke="#ff00ff" stroke-width="0.1"/>`,
    `</svg>`,
    '',
  ].join('\n');
}
