/**
 * Where bytes live: art files, outline PNGs, later exports. Keys are the SHA-256 of the content
 * (hex), so the same bytes are stored once. The local-disk driver is the default; an
 * S3-compatible driver implements the same interface.
 */
export interface Storage {
  put(data: Buffer): Promise<{ key: string; size: number }>;
  get(key: string): Promise<Buffer>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
  /** Every stored object with when it was last written or re-put (the sweep's grace period runs from it). */
  list(): AsyncIterable<{ key: string; modifiedAt: Date }>;
  /** When the object was last written or re-put; null when it is not there. */
  modifiedAt(key: string): Promise<Date | null>;
  /** Removes something `list` gave that is not an object (a half-written temporary file). */
  deleteLeftover?(name: string): Promise<void>;
}

export class StorageKeyError extends Error {}

export const KEY_PATTERN = /^[0-9a-f]{64}$/;
