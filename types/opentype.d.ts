// The part of opentype.js (MIT) that Sheetsmith uses: parse a font file, each glyph's outline and advance.
declare module 'opentype.js' {
  export type BoundingBox = { x1: number; y1: number; x2: number; y2: number };
  export type Path = { getBoundingBox(): BoundingBox; toPathData(decimalPlaces?: number): string };
  export type Glyph = { index: number; advanceWidth?: number; getPath(x: number, y: number, fontSize: number): Path };
  export type Font = {
    charToGlyph(char: string): Glyph;
    getKerningValue(left: Glyph, right: Glyph): number;
    unitsPerEm: number;
    ascender: number;
    descender: number;
    getPath(text: string, x: number, y: number, fontSize: number, options?: { kerning?: boolean }): Path;
    getAdvanceWidth(text: string, fontSize: number, options?: { kerning?: boolean }): number;
    charToGlyphIndex(char: string): number;
  };
  export function parse(buffer: ArrayBuffer): Font;
  const opentype: { parse: typeof parse };
  export default opentype;
}
