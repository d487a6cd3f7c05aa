import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';

/**
 * A local S3 fake (s3rver, test-only) on a free loopback port with one bucket, and the settings a
 * Sheetsmith S3 driver needs to reach it. Close it after the test file.
 */
export async function startS3Fake(bucket = 'sheetsmith-test') {
  const directory = await mkdtemp(path.join(tmpdir(), 'ss-s3-'));
  const server = new S3rver({ port: 0, address: '127.0.0.1', directory, silent: true, configureBuckets: [{ name: bucket, configs: [] }] });
  const { port } = (await server.run()) as { port: number };
  return {
    endpoint: `http://127.0.0.1:${port}`,
    settings: {
      endpoint: `http://127.0.0.1:${port}`,
      region: 'us-east-1',
      bucket,
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      forcePathStyle: true,
    },
    close: async () => {
      await server.close();
      await rm(directory, { recursive: true, force: true });
    },
  };
}
