// Stickers made from words or a simple shape: the words laid out with a font shipped with the app
// (opentype.js turns each line into outlines, so nothing depends on the fonts installed on the
// server), the shape drawn around them, all as an SVG in millimetres. The SVG then goes into the
// library like an uploaded one (svg-art.ts: cleaned, drawn at 300 DPI), so a made sticker gets its
// border, cut line, preflight, arrange and export like any art.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import opentype from 'opentype.js';
import type { Font, Glyph } from 'opentype.js';
import type { MadeArt, StickerFont } from '@shared/schemas/made-art';
import { MADE_ART_MAX_MM, STICKER_FONTS } from '@shared/schemas/made-art';
import { validationError } from '../../lib/errors';

const require = createRequire(import.meta.url);
const fonts = new Map<StickerFont, Font>();
function fontOf(name: StickerFont): Font {
  let font = fonts.get(name);
  if (!font) {
    const bytes = readFileSync(require.resolve(STICKER_FONTS[name].file));
    font = opentype.parse(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    fonts.set(name, font);
  }
  return font;
}

type Box = { x1: number; y1: number; x2: number; y2: number };
const LINE_HEIGHT = 1.25;
const n = (v: number) => Number(v.toFixed(3));

/**
 * One line laid out glyph by glyph (advance widths and kerning pairs; no ligatures or other
 * substitutions, which Latin stickers do not need): its outline, its box and its width.
 */
function line(font: Font, fontName: StickerFont, text: string, x: number, y: number, size: number) {
  const scale = size / font.unitsPerEm;
  const parts: string[] = [];
  const box: Box = { x1: Infinity, y1: Infinity, x2: -Infinity, y2: -Infinity };
  let pen = x;
  let previous: Glyph | null = null;
  for (const char of text) {
    const glyph = font.charToGlyph(char);
    if (glyph.index === 0 && char.trim() !== '')
      throw validationError({ text: `The ${STICKER_FONTS[fontName].label} font has no letter for “${char}”` });
    if (previous) {
      try {
        pen += font.getKerningValue(previous, glyph) * scale;
      } catch {
        // a kerning table this reader cannot use: no kerning for the pair
      }
    }
    const path = glyph.getPath(pen, y, size);
    const b = path.getBoundingBox();
    if (b.x2 > b.x1 && b.y2 > b.y1) {
      parts.push(path.toPathData(3));
      box.x1 = Math.min(box.x1, b.x1);
      box.y1 = Math.min(box.y1, b.y1);
      box.x2 = Math.max(box.x2, b.x2);
      box.y2 = Math.max(box.y2, b.y2);
    }
    pen += (glyph.advanceWidth ?? 0) * scale;
    previous = glyph;
  }
  return { d: parts.join(' '), box, width: pen - x };
}

/** The words as outlines (mm), lines aligned within the widest; null when nothing is drawn. */
function words(a: MadeArt, size: number): { d: string; box: Box } | null {
  const font = fontOf(a.font);
  const lines = a.text.replace(/\r/g, '').split('\n');
  const widths = lines.map((l) => line(font, a.font, l, 0, 0, size).width);
  const widest = Math.max(...widths);
  const box: Box = { x1: Infinity, y1: Infinity, x2: -Infinity, y2: -Infinity };
  const parts: string[] = [];
  lines.forEach((text, i) => {
    const x = a.align === 'left' ? 0 : a.align === 'right' ? widest - widths[i] : (widest - widths[i]) / 2;
    const laid = line(font, a.font, text, x, (font.ascender / font.unitsPerEm) * size + i * LINE_HEIGHT * size, size);
    if (!laid.d) return; // a blank line, or spaces only
    parts.push(laid.d);
    box.x1 = Math.min(box.x1, laid.box.x1);
    box.y1 = Math.min(box.y1, laid.box.y1);
    box.x2 = Math.max(box.x2, laid.box.x2);
    box.y2 = Math.max(box.y2, laid.box.y2);
  });
  return parts.length ? { d: parts.join(' '), box } : null;
}

function shapeElement(a: MadeArt, w: number, h: number): string {
  if (a.shape === 'circle') return `<circle cx="${n(w / 2)}" cy="${n(h / 2)}" r="${n(w / 2)}" fill="${a.fill}"/>`;
  const r = a.shape === 'label' ? h / 2 : Math.min(w, h) * 0.18;
  return `<rect x="0" y="0" width="${n(w)}" height="${n(h)}" rx="${n(r)}" fill="${a.fill}"/>`;
}

/** The made sticker as an SVG document sized in millimetres. */
export function madeArtSvg(a: MadeArt): string {
  const svg = (w: number, h: number, view: string, body: string) =>
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(w)}mm" height="${n(h)}mm" viewBox="${view}">${body}</svg>`;
  const tooLarge = (w: number, h: number) => {
    if (Math.max(w, h) > MADE_ART_MAX_MM)
      throw validationError(
        { letterMm: `The words make art ${Math.round(w)} × ${Math.round(h)} mm; the most is ${MADE_ART_MAX_MM} mm a side` },
        `The words make art ${Math.round(w)} × ${Math.round(h)} mm, over ${MADE_ART_MAX_MM} mm a side. Use a smaller letter size or fewer words per line.`,
      );
  };
  if (a.kind === 'text') {
    const drawn = words(a, a.letterMm);
    if (!drawn) throw validationError({ text: 'Type the words for the sticker' });
    const pad = 0.5;
    const w = drawn.box.x2 - drawn.box.x1 + 2 * pad,
      h = drawn.box.y2 - drawn.box.y1 + 2 * pad;
    tooLarge(w, h);
    return svg(w, h, `${n(drawn.box.x1 - pad)} ${n(drawn.box.y1 - pad)} ${n(w)} ${n(h)}`, `<path d="${drawn.d}" fill="${a.textColour}"/>`);
  }
  const w = a.shapeWidthMm,
    h = a.shape === 'circle' ? a.shapeWidthMm : a.shapeHeightMm;
  let body = shapeElement(a, w, h);
  let drawn = a.text.trim() ? words(a, a.letterMm) : null;
  if (drawn) {
    // Words inside a shape keep clear of its edge: shrunk to fit 80 % of it (a circle: of its inner square).
    const room = a.shape === 'circle' ? (w * 0.8) / Math.SQRT2 : 0.8 * (a.shape === 'label' ? w - h / 2 : w);
    const roomH = a.shape === 'circle' ? room : 0.8 * h;
    const scale = Math.min(1, room / (drawn.box.x2 - drawn.box.x1), roomH / (drawn.box.y2 - drawn.box.y1));
    if (scale < 1) drawn = words(a, a.letterMm * scale)!;
    const dx = w / 2 - (drawn.box.x1 + drawn.box.x2) / 2,
      dy = h / 2 - (drawn.box.y1 + drawn.box.y2) / 2;
    body += `<path transform="translate(${n(dx)} ${n(dy)})" d="${drawn.d}" fill="${a.textColour}"/>`;
  }
  return svg(w, h, `0 0 ${n(w)} ${n(h)}`, body);
}
