/**
 * One interface for every stored byte the server keeps outside its database: photos (`photos/<sha256>`),
 * NDT reports (`ndt-reports/<sha256>`), PDF documents (`documents/<sha256>`) and cached notice PDFs (`cache/notice-pdfs/<name>`). Two drivers:
 * the disk (disk.ts, the default) and S3-compatible object storage (s3.ts); STORAGE_URL picks one.
 *
 * The one promise every driver keeps: when `put` resolves, the object is durably stored and is read back
 * whole (never half), so a database row written after it may say the bytes are there.
 */
export interface ObjectStorage {
  /** Where the objects are, for logs: `disk /srv/data` or `s3://bucket/prefix/`. */
  readonly description: string;
  /** Stores the bytes whole under `key`, replacing any object there; durable when it resolves. */
  put(key: string, bytes: Uint8Array): Promise<void>;
  /** The object's bytes, or null when there is none. */
  get(key: string): Promise<Buffer | null>;
  has(key: string): Promise<boolean>;
  /** Removes the object; no error when it is already gone. */
  remove(key: string): Promise<void>;
  /** The names of the objects directly in `folder` (no temporary ones), sorted. */
  list(folder: string): Promise<string[]>;
  /**
   * Removes what interrupted writes left in `folder` more than an hour ago; returns how many. Only the
   * disk leaves such things (an S3 PutObject either stores the whole object or nothing).
   */
  sweepPartial(folder: string, now?: number): Promise<number>;
  /** Checks the storage can be reached and used; throws StorageError with a plain message if not. */
  check(): Promise<void>;
}

export class StorageError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'StorageError';
  }
}

/** Stored keys: `folder/name` segments of plain characters, none starting with a dot (temporaries do). */
const keyPattern = /^[A-Za-z0-9_][A-Za-z0-9._-]*(\/[A-Za-z0-9_][A-Za-z0-9._-]*)*$/;

export function assertKey(key: string): void {
  if (!keyPattern.test(key) || key.split('/').includes('..'))
    throw new StorageError(`"${key}" is not a storage key`);
}

/** The folders the server stores into; the backup and the move script walk these. */
export const storedFolders = {
  photos: 'photos',
  ndtReports: 'ndt-reports',
  documents: 'documents',
  noticePdfs: 'cache/notice-pdfs',
} as const;
