/**
 * STORAGE_URL: where photos, NDT reports and cached notice PDFs are kept. Parsed once at start; a value
 * that cannot be used stops the server with a message saying what is wrong and what would do.
 *
 * - unset or `file:` → the disk, under DATA_DIR (the layout every earlier release used);
 *   `file:///absolute/dir` → the disk under that folder instead (useful as a source for `storage:move`).
 * - `s3://<bucket>[/<prefix>]` → S3-compatible object storage through the AWS SDK. Options as query
 *   parameters: `endpoint` (an http(s) URL, for MinIO, Garage, Ceph and the like), `region`, and
 *   `forcePathStyle` (true/false). Without them the SDK's own settings apply (AWS_ENDPOINT_URL_S3,
 *   AWS_REGION); the region falls back to us-east-1, which S3-compatible stores accept. Credentials are
 *   never in the URL: the SDK's standard chain finds them (AWS_ACCESS_KEY_ID and AWS_SECRET_ACCESS_KEY,
 *   a profile, or an instance role).
 */
import path from 'node:path';

export type StorageSettings =
  | { driver: 'disk'; /** Absolute folder; null means DATA_DIR. */ root: string | null }
  | {
      driver: 's3';
      bucket: string;
      /** '' or a key prefix ending in '/'. */
      prefix: string;
      region: string | null;
      endpoint: string | null;
      forcePathStyle: boolean;
    };

const s3Options = ['endpoint', 'region', 'forcePathStyle'];

/** S3's bucket naming rules: 3–63 characters of a-z, 0-9, dots and hyphens, a letter or digit at each end. */
const bucketPattern = /^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/;
/** Key prefix segments: the same plain characters stored keys use. */
const prefixSegment = /^[A-Za-z0-9_][A-Za-z0-9._-]*$/;

export class StorageUrlError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StorageUrlError';
  }
}

const example = 'e.g. s3://pivotwatch-files/prod?endpoint=http://127.0.0.1:9000&forcePathStyle=true';

/** Parses STORAGE_URL (undefined or '' for the default); throws StorageUrlError with a plain message. */
export function parseStorageUrl(value: string | undefined): StorageSettings {
  const text = (value ?? '').trim();
  if (text === '' || text === 'file:' || text === 'file://') return { driver: 'disk', root: null };
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new StorageUrlError(
      `is not a URL; use file: (the disk under DATA_DIR) or s3://<bucket>[/<prefix>], ${example}`,
    );
  }
  if (url.protocol === 'file:') {
    if (url.host !== '' || url.search !== '' || url.hash !== '')
      throw new StorageUrlError(
        'a file: URL takes only a folder, e.g. file:///srv/pivotwatch-files (or file: for DATA_DIR)',
      );
    const root = decodeURIComponent(url.pathname);
    if (!path.isAbsolute(root)) throw new StorageUrlError('a file: URL needs an absolute folder');
    return { driver: 'disk', root: path.resolve(root) };
  }
  if (url.protocol !== 's3:')
    throw new StorageUrlError(
      `${url.protocol}// is not a storage this server knows; use file: or s3://, ${example}`,
    );
  if (url.username !== '' || url.password !== '')
    throw new StorageUrlError(
      'must not hold credentials; set AWS_ACCESS_KEY_ID and AWS_SECRET_ACCESS_KEY (or a profile or role) instead',
    );
  const bucket = url.hostname;
  if (!bucketPattern.test(bucket) || bucket.includes('..'))
    throw new StorageUrlError(
      `"${bucket}" is not a bucket name: 3 to 63 characters of a-z, 0-9, dots and hyphens, ${example}`,
    );
  if (url.port !== '')
    throw new StorageUrlError('s3://<bucket> takes no port; give the server as ?endpoint=http://host:port');
  // From the text as written: the URL parser would quietly resolve `..` and `.` away.
  const rawPath = text.replace(/^s3:\/\/[^/?#]*/i, '').split(/[?#]/)[0];
  const segments = rawPath.split('/').filter((s) => s !== '');
  const badSegment = segments.find((s) => !prefixSegment.test(s));
  if (badSegment !== undefined)
    throw new StorageUrlError(
      `the prefix part "${badSegment}" may hold only letters, digits, dot, dash and underscore`,
    );
  const unknown = [...url.searchParams.keys()].filter((k) => !s3Options.includes(k));
  if (unknown.length > 0)
    throw new StorageUrlError(
      `unknown option ${unknown.map((k) => `"${k}"`).join(', ')}; s3:// takes ${s3Options.join(', ')}`,
    );
  const endpoint = url.searchParams.get('endpoint');
  if (endpoint !== null) {
    let ok = false;
    try {
      const e = new URL(endpoint);
      ok = (e.protocol === 'http:' || e.protocol === 'https:') && e.hostname !== '';
    } catch {
      ok = false;
    }
    if (!ok) throw new StorageUrlError(`endpoint "${endpoint}" must be an http:// or https:// URL`);
  }
  const region = url.searchParams.get('region');
  if (region !== null && !/^[a-z0-9-]{1,64}$/.test(region))
    throw new StorageUrlError(`region "${region}" is not a region name, e.g. us-east-1`);
  const pathStyle = url.searchParams.get('forcePathStyle');
  if (pathStyle !== null && pathStyle !== 'true' && pathStyle !== 'false')
    throw new StorageUrlError(`forcePathStyle must be true or false, not "${pathStyle}"`);
  return {
    driver: 's3',
    bucket,
    prefix: segments.length === 0 ? '' : `${segments.join('/')}/`,
    region,
    endpoint: endpoint === null ? null : endpoint.replace(/\/+$/, ''),
    forcePathStyle: pathStyle === 'true',
  };
}

/** One line for logs and the move script; never holds a secret (credentials are not in the URL). */
export function describeStorage(settings: StorageSettings, dataDir: string): string {
  if (settings.driver === 'disk') return `disk ${settings.root ?? dataDir}`;
  const where = `s3://${settings.bucket}/${settings.prefix}`;
  return settings.endpoint ? `${where} at ${settings.endpoint}` : where;
}
