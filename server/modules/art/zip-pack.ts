import yauzl from 'yauzl';
import type { Entry, ZipFile } from 'yauzl';
import { AppError } from '../../lib/errors';

export type PackLimits = {
  maxEntries: number;
  /** Sum of the uncompressed sizes of the images taken. */
  maxTotalBytes: number;
  maxEntryBytes: number;
  /** Largest uncompressed / compressed ratio of one entry before it is called a zip bomb. */
  maxRatio: number;
};

export const DEFAULT_PACK_LIMITS: PackLimits = {
  maxEntries: 2000,
  maxTotalBytes: 500 * 1024 * 1024,
  maxEntryBytes: 50 * 1024 * 1024,
  maxRatio: 200,
};

type PackImage = { path: string; folders: string[]; data: Buffer };
type PackSkip = { path: string; reason: string };

const IMAGE = /\.(png|jpe?g|webp|svg)$/i;
const DAMAGED =
  'This zip could not be opened: it is damaged or was only partly downloaded. Download the pack again, or unzip it yourself and upload the images.';
const refused = (message: string) => new AppError(422, 'zip_refused', `${message} Nothing from this zip was stored.`);

function open(buffer: Buffer): Promise<ZipFile> {
  return new Promise((resolve, reject) =>
    yauzl.fromBuffer(buffer, { lazyEntries: true, validateEntrySizes: true, strictFileNames: true }, (error, zip) =>
      error ? reject(error) : resolve(zip),
    ),
  );
}

function readEntry(zip: ZipFile, entry: Entry, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    zip.openReadStream(entry, (error, stream) => {
      if (error) return reject(error);
      const parts: Buffer[] = [];
      let size = 0;
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length;
        // Never trust the declared size alone: stop reading as soon as the real bytes pass the limit.
        if (size > limit) stream.destroy(refused(`"${entry.fileName}" unpacks to more than the limit.`));
        else parts.push(chunk);
      });
      stream.on('error', reject);
      stream.on('end', () => resolve(Buffer.concat(parts)));
    });
  });
}

/**
 * Reads a whole clip-art pack from a zip held in memory, all or nothing: a path escaping the zip
 * (`../`, absolute), an encrypted entry, too many entries, an entry or total over the limits, or a
 * compression ratio typical of zip bombs refuses the whole zip. Non-image entries, nested zips and
 * system files are skipped and reported.
 */
export async function readPack(
  buffer: Buffer,
  limits: PackLimits = DEFAULT_PACK_LIMITS,
): Promise<{ images: PackImage[]; skipped: PackSkip[] }> {
  let zip: ZipFile;
  try {
    zip = await open(buffer);
  } catch {
    throw refused(DAMAGED);
  }
  if (zip.entryCount > limits.maxEntries) {
    zip.close();
    throw refused(`The zip has ${zip.entryCount} entries; the limit is ${limits.maxEntries}.`);
  }
  const images: PackImage[] = [];
  const skipped: PackSkip[] = [];
  let total = 0;

  await new Promise<void>((resolve, reject) => {
    const fail = (error: unknown) => {
      zip.close();
      reject(error instanceof AppError ? error : describe(error));
    };
    zip.on('error', fail);
    zip.on('end', () => resolve());
    zip.on('entry', (entry: Entry) => {
      const path = entry.fileName;
      const next = () => zip.readEntry();
      if (path.endsWith('/')) return next();
      if (entry.isEncrypted()) return fail(refused(`"${path}" is password-protected. Unzip the pack yourself and upload the images.`));
      const segments = path.split('/');
      const name = segments[segments.length - 1];
      if (segments.includes('__MACOSX') || name.startsWith('.')) {
        skipped.push({ path, reason: 'System file, not art.' });
        return next();
      }
      if (/\.(zip|rar|7z|tar|gz)$/i.test(name)) {
        skipped.push({ path, reason: 'Archives inside the zip are not opened. Upload that pack on its own.' });
        return next();
      }
      if (!IMAGE.test(name)) {
        skipped.push({ path, reason: 'Not an image (PNG, JPEG, WebP or SVG).' });
        return next();
      }
      const declared = entry.uncompressedSize;
      if (declared > limits.maxEntryBytes)
        return fail(
          refused(
            `"${path}" unpacks to ${Math.round(declared / 1048576)} MB; the limit per image is ${Math.round(limits.maxEntryBytes / 1048576)} MB.`,
          ),
        );
      if (entry.compressedSize > 0 && declared / entry.compressedSize > limits.maxRatio && declared > 1024 * 1024) {
        return fail(refused(`"${path}" is compressed ${Math.round(declared / entry.compressedSize)}:1, which looks like a zip bomb.`));
      }
      if (total + declared > limits.maxTotalBytes)
        return fail(refused(`The images unpack to more than ${Math.round(limits.maxTotalBytes / 1048576)} MB in all.`));
      readEntry(zip, entry, limits.maxEntryBytes)
        .then((data) => {
          total += data.length;
          if (total > limits.maxTotalBytes)
            return fail(refused(`The images unpack to more than ${Math.round(limits.maxTotalBytes / 1048576)} MB in all.`));
          images.push({ path, folders: segments.slice(0, -1), data });
          next();
        })
        .catch(fail);
    });
    zip.readEntry();
  });
  return { images, skipped };
}

function describe(error: unknown): AppError {
  const message = String((error as Error)?.message ?? error);
  if (/invalid relative path|absolute path|invalid characters/i.test(message)) {
    const name = message.replace(/^.*?: /, '').slice(0, 120);
    return refused(
      `The zip holds a file ("${name}") whose path points outside the zip's own folder, which Sheetsmith never unpacks. Unzip the pack yourself and upload the images.`,
    );
  }
  return refused(DAMAGED);
}
