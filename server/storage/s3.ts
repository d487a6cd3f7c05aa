import { createHash } from 'node:crypto';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import type { Storage } from './storage';
import { KEY_PATTERN, StorageKeyError } from './storage';

// The SDK warns on every start that its releases after January 2027 will need Node 22; this
// project runs on Node 20 by requirement, so the warning says nothing a maker or operator can act on.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

type S3Settings = {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle: boolean;
  prefix?: string;
};

/** A missing object, as the local driver reports it (code ENOENT), so callers treat both alike. */
const missing = (key: string) => Object.assign(new Error(`No stored object ${key}`), { code: 'ENOENT' });
const notFound = (error: unknown) => {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e.name === 'NoSuchKey' || e.name === 'NotFound' || e.$metadata?.httpStatusCode === 404;
};

/**
 * Content-addressed objects in an S3-compatible bucket under `prefix/ab/cd/<sha256>` (the same
 * layout as on disk). Re-putting existing bytes writes them again, so the last-modified time is
 * renewed and the sweep's grace period starts again, as on disk.
 */
export class S3Storage implements Storage {
  readonly client: S3Client;

  constructor(private readonly s: S3Settings) {
    this.client = new S3Client({
      endpoint: s.endpoint || undefined,
      region: s.region,
      forcePathStyle: s.forcePathStyle,
      credentials: s.accessKeyId && s.secretAccessKey ? { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey } : undefined,
    });
  }

  private objectKey(key: string): string {
    if (!KEY_PATTERN.test(key)) throw new StorageKeyError(`Not a storage key: ${key.slice(0, 80)}`);
    return `${this.s.prefix ? `${this.s.prefix}/` : ''}${key.slice(0, 2)}/${key.slice(2, 4)}/${key}`;
  }

  async put(data: Buffer) {
    const key = createHash('sha256').update(data).digest('hex');
    // Writing the same bytes again (rather than a metadata copy, which not every S3 service dates
    // anew) renews the object's last-modified time everywhere; objects are immutable, so it is safe.
    await this.client.send(
      new PutObjectCommand({ Bucket: this.s.bucket, Key: this.objectKey(key), Body: data, ContentLength: data.length }),
    );
    return { key, size: data.length };
  }

  async get(key: string): Promise<Buffer> {
    try {
      const res = await this.client.send(new GetObjectCommand({ Bucket: this.s.bucket, Key: this.objectKey(key) }));
      return Buffer.from(await res.Body!.transformToByteArray());
    } catch (error) {
      if (notFound(error)) throw missing(key);
      throw error;
    }
  }

  async exists(key: string): Promise<boolean> {
    return (await this.modifiedAt(key)) !== null;
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.s.bucket, Key: this.objectKey(key) }));
  }

  async modifiedAt(key: string): Promise<Date | null> {
    try {
      const head = await this.client.send(new HeadObjectCommand({ Bucket: this.s.bucket, Key: this.objectKey(key) }));
      return head.LastModified ?? null;
    } catch (error) {
      if (notFound(error)) return null;
      throw error;
    }
  }

  async *list(): AsyncIterable<{ key: string; modifiedAt: Date }> {
    let ContinuationToken: string | undefined;
    do {
      const page = await this.client.send(
        new ListObjectsV2Command({ Bucket: this.s.bucket, Prefix: this.s.prefix ? `${this.s.prefix}/` : undefined, ContinuationToken }),
      );
      for (const object of page.Contents ?? []) {
        const name = object.Key!.split('/').pop()!;
        if (KEY_PATTERN.test(name)) yield { key: name, modifiedAt: object.LastModified ?? new Date(0) };
      }
      ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (ContinuationToken);
  }
}
