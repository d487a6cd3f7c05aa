// The print image for the PDF without decoding or recompressing it in JavaScript. A PNG's IDAT
// data is a zlib stream of filtered rows (PNG spec §10, §9), and PDF's FlateDecode with
// /Predictor 15 reads exactly that (ISO 32000-1 §7.4.4.4, Table 9). PDF keeps transparency in a
// separate soft mask (§11.6.5.3), so the colour and the alpha are encoded as two PNGs by sharp
// (native zlib) and their IDAT data become the image stream and its SMask.
import sharp from 'sharp';
import type { PrintRaster } from './print-image';

/** One 8-bit image stream's zlib data with what the PDF needs to read it. */
export type PdfImageStream = { data: Buffer; width: number; height: number; colours: 1 | 3 };
export type PdfImage = { colour: PdfImageStream; alpha: PdfImageStream | null };

const PNG_SIGNATURE = Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]);

/** The concatenated IDAT data of a non-interlaced 8-bit grey (1) or RGB (3) PNG. */
function pngImageData(png: Buffer, colours: 1 | 3): PdfImageStream {
  if (!png.subarray(0, 8).equals(PNG_SIGNATURE)) throw new Error('not a PNG');
  const parts: Buffer[] = [];
  let width = 0,
    height = 0;
  for (let at = 8; at + 8 <= png.length;) {
    const length = png.readUInt32BE(at);
    const type = png.toString('latin1', at + 4, at + 8);
    const data = png.subarray(at + 8, at + 8 + length);
    if (type === 'IHDR') {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      const [depth, colourType, , , interlace] = data.subarray(8, 13);
      if (depth !== 8 || colourType !== (colours === 3 ? 2 : 0) || interlace !== 0)
        throw new Error(`PNG is not 8-bit ${colours === 3 ? 'RGB' : 'grey'} without interlace`);
    } else if (type === 'IDAT') parts.push(data);
    else if (type === 'IEND') break;
    at += 12 + length;
  }
  if (!width || !parts.length) throw new Error('PNG has no image data');
  return { data: Buffer.concat(parts), width, height, colours };
}

/** The print raster's colour (and, unless it is opaque, its alpha) as PDF image streams. */
export async function pdfImageOf(raster: PrintRaster): Promise<PdfImage> {
  const input = () => sharp(raster.rgba, { raw: { width: raster.width, height: raster.height, channels: 4 } });
  const png = { compressionLevel: 6, palette: false } as const;
  const [colour, alpha] = await Promise.all([
    input().removeAlpha().png(png).toBuffer(),
    raster.opaque ? null : input().extractChannel(3).png(png).toBuffer(),
  ]);
  return { colour: pngImageData(colour, 3), alpha: alpha ? pngImageData(alpha, 1) : null };
}
