// s3rver ships no types; the part of its API the local S3 fake uses.
declare module 's3rver' {
  import type { AddressInfo } from 'node:net';
  export default class S3rver {
    constructor(options: {
      address?: string;
      port?: number;
      silent?: boolean;
      directory: string;
      configureBuckets?: Array<{ name: string }>;
      resetOnClose?: boolean;
    });
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
