import { ZipArchive } from 'archiver';
import { PassThrough } from 'node:stream';

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
    for (const file of files) archive.append(file.data, { name: file.name });
    void archive.finalize();
  });
}
