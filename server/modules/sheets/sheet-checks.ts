// What a sheet save must pass before anything is written: pieces within the sheet's bounds, and a
// thumbnail that is a small PNG and nothing else.
import sharp from 'sharp';
import type { Metadata } from 'sharp';
import type { SheetDocument } from '@shared/sheet/document';
import { documentProblems, problemField } from '@shared/sheet/bounds';
import type { LengthUnit } from '@shared/units';
import { validationError } from '../../lib/errors';

/** A save whose pieces break the sheet's physical bounds is refused, every problem named in the sheet's unit. */
export function refuseOutOfBounds(doc: SheetDocument, unit: LengthUnit) {
  const problems = documentProblems(doc);
  if (problems.length === 0) return;
  const fields = Object.fromEntries(problems.map((p) => [problemField(p), p.message(unit)]));
  const more = problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : '';
  throw validationError(fields, `${problems[0].message(unit)}${more} Nothing was saved.`);
}

const THUMBNAIL_MAX_PX = 1024;

/** The editor's thumbnail must decode as a PNG of at most 1024 px a side; it is stored re-encoded, so nothing else rides along. */
export async function cleanThumbnail(dataUrl: string): Promise<Buffer> {
  const bytes = Buffer.from(dataUrl.split(',')[1], 'base64');
  const refuse = (why: string) =>
    validationError({ thumbnail: why }, `The sheet preview was refused: ${why.toLowerCase()}. Nothing was saved.`);
  let meta: Metadata;
  try {
    meta = await sharp(bytes, { limitInputPixels: THUMBNAIL_MAX_PX * THUMBNAIL_MAX_PX }).metadata();
  } catch {
    throw refuse('It is not a PNG image');
  }
  if (meta.format !== 'png') throw refuse('It is not a PNG image');
  if (!meta.width || !meta.height || meta.width > THUMBNAIL_MAX_PX || meta.height > THUMBNAIL_MAX_PX)
    throw refuse(`It is larger than ${THUMBNAIL_MAX_PX} px a side`);
  try {
    return await sharp(bytes).png().toBuffer();
  } catch {
    throw refuse('It is not a PNG image');
  }
}
