/**
 * A local S3 for the tests: s3rver (an npm package implementing the S3 REST API on the file system),
 * started on a free loopback port in a temporary folder and stopped after. The S3 driver talks to it with
 * the real AWS SDK client, so the requests it makes are those it makes against any S3-compatible store.
 */
import fs from 'node:fs';

import S3rver from 's3rver';

import { makeTempDir } from './helpers';

export type FakeS3 = {
  /** A STORAGE_URL for a fresh prefix in the bucket: each call gives an empty storage. */
  url: (prefix?: string) => string;
  bucket: string;
  endpoint: string;
  stop: () => Promise<void>;
};

let prefixes = 0;

export async function startFakeS3(bucket = 'pivotwatch-test'): Promise<FakeS3> {
  const dir = makeTempDir('pivotwatch-s3-');
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    directory: dir,
    silent: true,
    configureBuckets: [{ name: bucket }],
  });
  const { port } = await server.run();
  // s3rver accepts these fixed credentials; the driver finds them through the SDK's standard chain.
  process.env.AWS_ACCESS_KEY_ID = 'S3RVER';
  process.env.AWS_SECRET_ACCESS_KEY = 'S3RVER';
  const endpoint = `http://127.0.0.1:${port}`;
  return {
    bucket,
    endpoint,
    url: (prefix = `run-${process.pid}-${++prefixes}`) =>
      `s3://${bucket}/${prefix}?endpoint=${endpoint}&region=us-east-1&forcePathStyle=true`,
    stop: async () => {
      await server.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
