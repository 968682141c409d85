// s3rver ships no types; the part the tests use.
declare module 's3rver' {
  import type { AddressInfo } from 'node:net';

  interface S3rverOptions {
    port?: number;
    address?: string;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    vhostBuckets?: boolean;
    configureBuckets?: { name: string }[];
  }

  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
    reset(): void;
  }
}
