// s3rver ships no type declarations; this covers the part of its API the fake uses.
declare module 's3rver' {
  import type { AddressInfo } from 'node:net';
  import type { Server } from 'node:http';

  interface S3rverBucketConfig {
    name: string;
    configs?: Array<string | Buffer>;
  }

  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    vhostBuckets?: boolean;
    allowMismatchedSignatures?: boolean;
    configureBuckets?: S3rverBucketConfig[];
  }

  class S3rver {
    constructor(options?: S3rverOptions);
    httpServer?: Server;
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }

  export default S3rver;
}
