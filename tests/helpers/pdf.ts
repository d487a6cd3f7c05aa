// Reading exported PDFs back with pdf.js (pdfjs-dist, Mozilla; test-only) and drawing them with @napi-rs/canvas.
import { createRequire } from 'node:module';
import path from 'node:path';

/** pdf.js (pdfjs-dist, test-only) with the standard 14 fonts' data it needs to draw the check bar's label. */
export const loadPdf = async (data: Buffer) => {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const standardFontDataUrl = `${path.dirname(createRequire(import.meta.url).resolve('pdfjs-dist/package.json'))}/standard_fonts/`;
  return pdfjs.getDocument({ data: new Uint8Array(data), useSystemFonts: false, isEvalSupported: false, standardFontDataUrl }).promise;
};

/** Page 1 rendered at 50 DPI on white with @napi-rs/canvas, with the optional content of `intent`. */
export async function renderPage(data: Buffer, intent: 'display' | 'print') {
  const { createCanvas } = await import('@napi-rs/canvas');
  const doc = await loadPdf(data);
  const page = await doc.getPage(1);
  const viewport = page.getViewport({ scale: 50 / 72 });
  const canvas = createCanvas(Math.ceil(viewport.width), Math.ceil(viewport.height));
  const ctx = canvas.getContext('2d');
  ctx.fillStyle = '#fff';
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  await page.render({
    canvasContext: ctx as never,
    viewport,
    intent,
    optionalContentConfigPromise: doc.getOptionalContentConfig({ intent }),
  }).promise;
  return { pixels: ctx.getImageData(0, 0, canvas.width, canvas.height).data, width: canvas.width };
}
