import yauzl from 'yauzl';
import { ZipArchive } from 'archiver';
import { PassThrough } from 'node:stream';

/** Files that are compressed already (deflate inside): stored as they are, not deflated again. */
const COMPRESSED = /\.(png|pdf|zip)$/i;

/** Zips named files in memory (archiver), in the order given. */
export function zipFiles(files: Array<{ name: string; data: Buffer | string }>): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const archive = new ZipArchive({ zlib: { level: 6 } });
    const sink = new PassThrough();
    const parts: Buffer[] = [];
    sink.on('data', (chunk: Buffer) => parts.push(chunk));
    sink.on('end', () => resolve(Buffer.concat(parts)));
    archive.on('error', reject);
    archive.pipe(sink);
    for (const file of files) archive.append(file.data, { name: file.name, store: COMPRESSED.test(file.name) });
    void archive.finalize();
  });
}

/** The media type each exported file is served with (IANA registrations; DXF as image/vnd.dxf). */
export function exportFileType(name: string): string {
  const ext = name.slice(name.lastIndexOf('.') + 1).toLowerCase();
  return (
    { png: 'image/png', svg: 'image/svg+xml', pdf: 'application/pdf', dxf: 'image/vnd.dxf', txt: 'text/plain; charset=utf-8' }[ext] ??
    'application/octet-stream'
  );
}

/** The names and sizes of the files in a bundle. */
export async function listZip(zip: Buffer): Promise<Array<{ name: string; size: number }>> {
  const out: Array<{ name: string; size: number }> = [];
  await eachEntry(zip, async (entry) => {
    out.push({ name: entry.fileName, size: entry.uncompressedSize });
    return false;
  });
  return out;
}

/** One file out of a bundle, byte for byte; null when the bundle has no such file. */
export async function readFromZip(zip: Buffer, name: string): Promise<Buffer | null> {
  let found: Buffer | null = null;
  await eachEntry(zip, async (entry, open) => {
    if (entry.fileName !== name) return false;
    found = await open();
    return true;
  });
  return found;
}

function eachEntry(zip: Buffer, visit: (entry: yauzl.Entry, open: () => Promise<Buffer>) => Promise<boolean>): Promise<void> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zip, { lazyEntries: true }, (error, file) => {
      if (error || !file) return reject(error);
      file.on('error', reject);
      file.on('end', () => resolve());
      file.on('entry', (entry: yauzl.Entry) => {
        const open = () =>
          new Promise<Buffer>((done, fail) =>
            file.openReadStream(entry, (err, stream) => {
              if (err || !stream) return fail(err);
              const parts: Buffer[] = [];
              stream.on('data', (c: Buffer) => parts.push(c));
              stream.on('end', () => done(Buffer.concat(parts)));
              stream.on('error', fail);
            }),
          );
        visit(entry, open).then((stop) => (stop ? (file.close(), resolve()) : file.readEntry()), reject);
      });
      file.readEntry();
    });
  });
}
