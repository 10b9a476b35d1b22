/**
 * The S3 driver: each object is an S3 object `<prefix><key>` in one bucket, through the AWS SDK v3 client,
 * so any S3-compatible store (AWS, MinIO, Garage, Ceph, R2…) serves. PutObject returns only once the
 * object is stored whole, which is the durability a database row written afterwards relies on.
 * Credentials come from the SDK's standard chain, never from STORAGE_URL.
 */
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';

import type { StorageSettings } from '@/server/storage-url';
import { assertKey, StorageError, type ObjectStorage } from '@/server/storage/types';

type S3Settings = Extract<StorageSettings, { driver: 's3' }>;

const statusOf = (error: unknown) =>
  error instanceof S3ServiceException ? error.$metadata.httpStatusCode : undefined;
const isNotFound = (error: unknown) =>
  statusOf(error) === 404 ||
  (error instanceof Error && (error.name === 'NoSuchKey' || error.name === 'NotFound'));

export function s3Storage(settings: S3Settings, env: NodeJS.ProcessEnv = process.env): ObjectStorage {
  const client = new S3Client({
    // The URL's options first; otherwise the SDK's own (AWS_ENDPOINT_URL_S3, AWS_REGION), then us-east-1.
    region: settings.region ?? env.AWS_REGION ?? env.AWS_DEFAULT_REGION ?? 'us-east-1',
    ...(settings.endpoint ? { endpoint: settings.endpoint } : {}),
    forcePathStyle: settings.forcePathStyle,
  });
  const { bucket, prefix } = settings;
  const where = `s3://${bucket}/${prefix}${settings.endpoint ? ` at ${settings.endpoint}` : ''}`;
  const objectKey = (key: string) => {
    assertKey(key);
    return `${prefix}${key}`;
  };

  return {
    description: where,
    async put(key, bytes) {
      await client.send(
        new PutObjectCommand({
          Bucket: bucket,
          Key: objectKey(key),
          Body: bytes,
          ContentLength: bytes.length,
        }),
      );
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: objectKey(key) }));
        if (!out.Body) return null;
        return Buffer.from(await out.Body.transformToByteArray());
      } catch (error) {
        if (isNotFound(error)) return null;
        throw error;
      }
    },
    async has(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket: bucket, Key: objectKey(key) }));
        return true;
      } catch (error) {
        if (isNotFound(error)) return false;
        throw error;
      }
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: objectKey(key) }));
    },
    async list(folder) {
      const start = `${objectKey(folder)}/`;
      const names: string[] = [];
      let token: string | undefined;
      do {
        const page = await client.send(
          new ListObjectsV2Command({
            Bucket: bucket,
            Prefix: start,
            Delimiter: '/',
            ContinuationToken: token,
          }),
        );
        for (const o of page.Contents ?? []) {
          const name = o.Key?.slice(start.length);
          if (name && !name.startsWith('.')) names.push(name);
        }
        token = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (token);
      return names.sort();
    },
    sweepPartial: () => Promise.resolve(0),
    async check() {
      try {
        await client.send(new HeadBucketCommand({ Bucket: bucket }));
      } catch (error) {
        const status = statusOf(error);
        const why =
          status === 404
            ? 'the bucket does not exist'
            : status === 403 || status === 401
              ? 'access was refused (check AWS_ACCESS_KEY_ID and AWS_SECRET_ACCESS_KEY)'
              : error instanceof Error
                ? error.message || error.name
                : String(error);
        throw new StorageError(`The object storage ${where} cannot be used: ${why}.`, { cause: error });
      }
    },
  };
}
