// s3rver (a local S3 fake, test-only) ships no types; only what the tests use.
declare module 's3rver' {
  type BucketConfig = { name: string; configs: Array<string | Buffer> };
  export default class S3rver {
    constructor(options: { port?: number; address?: string; directory: string; silent?: boolean; configureBuckets?: BucketConfig[] });
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
