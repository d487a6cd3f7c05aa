import type { Env } from '../config/env';
import { LocalDiskStorage } from './local-disk';
import { S3Storage } from './s3';
import type { Storage } from './storage';

/** The storage driver the environment asks for: local disk under DATA_DIR (default) or an S3 bucket. */
export function createStorage(env: Env): Storage {
  if (env.STORAGE_DRIVER === 's3') {
    return new S3Storage({
      endpoint: env.S3_ENDPOINT || undefined,
      region: env.S3_REGION,
      bucket: env.S3_BUCKET!,
      accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
      forcePathStyle: env.S3_FORCE_PATH_STYLE,
      prefix: env.S3_PREFIX || undefined,
    });
  }
  return new LocalDiskStorage(env.storageDir);
}
