// s3rver (a local fake S3 for tests) ships no types; this is the part tests/server/s3-fake.ts calls.
declare module 's3rver' {
  type Options = {
    address?: string;
    port?: number;
    directory: string;
    silent?: boolean;
    configureBuckets?: { name: string }[];
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
