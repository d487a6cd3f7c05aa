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
}

export class StorageKeyError extends Error {}

export const KEY_PATTERN = /^[0-9a-f]{64}$/;
