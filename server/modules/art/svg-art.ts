// Vector art: an uploaded SVG is cleaned before anything renders it, then drawn by sharp (librsvg)
// at the print DPI from its physical size, and stored as PNG art like any other; the cleaned SVG
// is kept beside it. Cleaning: no document type or entities at all (they can expand without
// bound), DOMPurify's SVG profile (no scripts, event handlers or foreign content) on jsdom, and
// no reference outside the file (href, url(), @import) except embedded PNG, JPEG or WebP data.
// Sizes: CSS/SVG absolute units (CSS Values and Units Level 3 §6.2: 1in = 96px = 72pt = 25.4mm).
import createDOMPurify from 'dompurify';
import { JSDOM } from 'jsdom';
import sharp from 'sharp';
import { AppError } from '../../lib/errors';

const SVG_LIMITS = { maxBytes: 5 * 1024 * 1024, maxElements: 20_000 };
/** The DPI vector art is drawn at: the print resolution. */
const SVG_DPI = 300;

const refuse = (message: string) => new AppError(422, 'svg_refused', message);
const UNIT_IN: Record<string, number> = { in: 1, cm: 1 / 2.54, mm: 1 / 25.4, pt: 1 / 72, pc: 1 / 6, px: 1 / 96, '': 1 / 96 };

/** True when the bytes are an SVG document (read from the bytes, never the file name). */
export function isSvg(data: Buffer): boolean {
  const head = data
    .subarray(0, 4096)
    .toString('utf8')
    .replace(/^\uFEFF/, '');
  // An XML declaration, comments or a document type (whose internal subset may hold '>') may come first.
  return /^\s*<(\?xml|!--|!DOCTYPE|svg[\s>])/i.test(head) && /<svg[\s>]/i.test(head) && !/<html[\s>]/i.test(head);
}

/** A length attribute in inches, or null when it has no absolute size (missing, %, em). */
function inches(value: string | null): number | null {
  const m = /^\s*([0-9]*\.?[0-9]+(?:e[-+]?\d+)?)\s*(in|cm|mm|pt|pc|px)?\s*$/i.exec(value ?? '');
  if (!m) return null;
  const n = Number(m[1]) * UNIT_IN[(m[2] ?? '').toLowerCase()];
  return n > 0 && Number.isFinite(n) ? n : null;
}

const outside = (value: string) => !/^\s*(#|data:image\/(png|jpe?g|webp)[;,])/i.test(value);
const externalUrl = /url\(\s*['"]?\s*(?!#)|@import/i;

/** The SVG cleaned for rendering, with its size in inches; refuses what cannot be made safe or has no size. */
export function cleanSvg(data: Buffer): { svg: string; widthIn: number; heightIn: number } {
  if (data.length > SVG_LIMITS.maxBytes)
    throw refuse(`This SVG is ${(data.length / 1048576).toFixed(1)} MB; the limit is ${SVG_LIMITS.maxBytes / 1048576} MB for vector art.`);
  const text = data.toString('utf8').replace(/^\uFEFF/, '');
  if (/<!DOCTYPE|<!ENTITY/i.test(text))
    throw refuse(
      'This SVG declares a document type or entities, which Sheetsmith does not read (they can hide an endless expansion). Save it again as plain SVG from your drawing program.',
    );
  if ((text.match(/<[a-z]/gi)?.length ?? 0) > SVG_LIMITS.maxElements)
    throw refuse(`This SVG has more than ${SVG_LIMITS.maxElements.toLocaleString('en')} elements. Simplify it, or export it as a PNG.`);

  const { window } = new JSDOM('');
  const purify = createDOMPurify(window as unknown as Parameters<typeof createDOMPurify>[0]);
  purify.addHook('uponSanitizeAttribute', (_node, attr) => {
    const name = attr.attrName.toLowerCase();
    if ((name === 'href' || name === 'xlink:href') && outside(attr.attrValue)) attr.keepAttr = false;
    else if (externalUrl.test(attr.attrValue)) attr.keepAttr = false;
  });
  purify.addHook('uponSanitizeElement', (node) => {
    if (node.nodeName.toLowerCase() === 'style' && externalUrl.test(node.textContent ?? '')) node.textContent = '';
  });
  // Parsed as HTML, DOMPurify's own and best-tested mode (the HTML parser keeps SVG's camelCase names).
  const body = purify.sanitize(text, { USE_PROFILES: { svg: true, svgFilters: true }, RETURN_DOM: true }) as unknown as HTMLElement;
  const root = body.querySelector('svg');
  if (!root) throw refuse('This file does not hold an SVG drawing Sheetsmith can read. Save it again as SVG, or export it as a PNG.');

  // The physical size: width and height when absolute, else the viewBox in CSS px.
  const box = (root.getAttribute('viewBox') ?? '')
    .trim()
    .split(/[\s,]+/)
    .map(Number);
  const hasBox = box.length === 4 && box.every(Number.isFinite) && box[2] > 0 && box[3] > 0;
  let widthIn = inches(root.getAttribute('width')),
    heightIn = inches(root.getAttribute('height'));
  if (widthIn === null && heightIn === null && hasBox) [widthIn, heightIn] = [box[2] / 96, box[3] / 96];
  else if (widthIn === null && heightIn !== null && hasBox) widthIn = (heightIn * box[2]) / box[3];
  else if (heightIn === null && widthIn !== null && hasBox) heightIn = (widthIn * box[3]) / box[2];
  if (widthIn === null || heightIn === null)
    throw refuse('This SVG has no size: give it a width and height (or a viewBox) in your drawing program and save it again.');
  // Without a viewBox the drawing is in the width/height's own user units: keep that mapping.
  if (!hasBox) root.setAttribute('viewBox', `0 0 ${widthIn * 96} ${heightIn * 96}`);
  root.setAttribute('width', `${widthIn}in`);
  root.setAttribute('height', `${heightIn}in`);
  root.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  const svg = new window.XMLSerializer().serializeToString(root);
  window.close();
  return { svg, widthIn, heightIn };
}

/** The cleaned SVG drawn at `dpi` (width and height rounded to whole pixels), as a PNG with its DPI recorded. */
export async function rasteriseSvg(clean: { svg: string; widthIn: number; heightIn: number }, maxPixels: number, dpi = SVG_DPI) {
  const width = Math.max(1, Math.round(clean.widthIn * dpi)),
    height = Math.max(1, Math.round(clean.heightIn * dpi));
  if (width * height > maxPixels)
    throw refuse(
      `This SVG is ${clean.widthIn.toFixed(2)} × ${clean.heightIn.toFixed(2)} in; at ${dpi} DPI that is ${width} × ${height} px, over the ${(maxPixels / 1e6).toFixed(0)} megapixel limit. Make it smaller in your drawing program.`,
    );
  // Sized in pixels at 72 DPI, librsvg draws one CSS pixel per output pixel: exact at any size.
  const sized = clean.svg.replace(/^<svg([^>]*?)\swidth="[^"]*"/, '<svg$1').replace(/^<svg([^>]*?)\sheight="[^"]*"/, '<svg$1');
  const drawable = sized.replace(/^<svg/, `<svg width="${width}" height="${height}"`);
  try {
    return await sharp(Buffer.from(drawable), { density: 72, limitInputPixels: maxPixels }).png().withMetadata({ density: dpi }).toBuffer();
  } catch {
    throw refuse('This SVG could not be drawn: part of it is damaged or uses features Sheetsmith cannot draw. Export it as a PNG instead.');
  }
}
