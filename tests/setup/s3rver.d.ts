/** The part of s3rver's API the tests use (the package ships no types). */
declare module 's3rver' {
  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    configureBuckets?: Array<{ name: string; configs: Array<string | Buffer> }>;
  }
  /** A local S3-compatible server. */
  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}
