import type { Readable } from 'node:stream';

/**
 * Where Gridset keeps the files it holds beyond one request (accepted DXF originals, the local mail
 * outbox): a folder on this machine by default, or a bucket of S3-compatible object storage when
 * S3_URL is set, so that every Gridset process behind a load balancer reads what any one of them kept.
 * Keys are relative paths with `/` between parts, the same in both: `uploads/<sha256>.dxf`.
 * Request-scoped temporary files (multer's `uploads/tmp`) never go through a store.
 */
export interface FileStore {
  /** `local` (the data folder) or `s3` (a bucket); said in start-up lines and backup manifests. */
  readonly kind: 'local' | 's3';
  /** Where the files are, for people: a folder path or `s3://bucket/prefix` at an endpoint; never a secret. */
  readonly location: string;
  /** Writes the whole body under key, replacing what was there; a reader never sees half of it. A stream needs its size. */
  put(key: string, body: Buffer | Readable, opts?: PutOptions): Promise<void>;
  /** The whole body, or null when nothing is kept under key; over maxBytes (default MAX_GET_BYTES) is a StoreError. */
  get(key: string, opts?: { maxBytes?: number }): Promise<Buffer | null>;
  /** The body as a stream with its size, or null when nothing is kept under key: for serving large files. */
  stream(key: string): Promise<{ body: Readable; size: number } | null>;
  has(key: string): Promise<boolean>;
  /** Removes the file; removing a missing one is not an error. */
  delete(key: string): Promise<void>;
  /** Every key starting with prefix, with its size, in code-point order. */
  list(prefix: string): Promise<StoredFile[]>;
  /** Resolves when the store can be used (the folder or the bucket is there); rejects with a StoreError saying what to fix. */
  check(): Promise<void>;
}

export interface PutOptions {
  contentType?: string;
  /** Bytes in a stream body (required for a stream: object storage needs the length up front). */
  size?: number;
}

export interface StoredFile { key: string; size: number }

/** The largest file get() reads into memory unless told otherwise: ten times the largest upload Gridset accepts by default. */
export const MAX_GET_BYTES = 200 * 1024 * 1024;
/** Longest key; S3 allows 1024 bytes and the prefix takes some of it. */
export const MAX_KEY_LENGTH = 512;
/** The multer temporary folder under the data folder: request-scoped, never a stored file. */
export const UPLOAD_TEMP_FOLDER = 'uploads/tmp';

/**
 * A store that cannot be used (unreachable, refused credentials, a file over the size bound). The code
 * STORAGE_UNAVAILABLE makes the error handler answer 503 with a sentence, never a 500.
 */
export class StoreError extends Error {
  readonly code = 'STORAGE_UNAVAILABLE';
  constructor(message: string, override readonly cause?: unknown) {
    super(message);
  }
}

// Parts start with a letter or digit (no `.`, `..` or hidden names) and hold only characters that mean
// the same in a file name on every system and in an S3 key.
const KEY = /^[A-Za-z0-9][A-Za-z0-9._-]*(?:\/[A-Za-z0-9][A-Za-z0-9._-]*)*$/;

/** True when key is a valid stored-file key (see checkKey). */
export const isKey = (key: string) => key.length <= MAX_KEY_LENGTH && KEY.test(key) && !(key === UPLOAD_TEMP_FOLDER || key.startsWith(`${UPLOAD_TEMP_FOLDER}/`));

/** Refuses a key that could leave its folder or collide with the upload temporary folder: a programming error, not a user's. */
export function checkKey(key: string): string {
  if (key.length > MAX_KEY_LENGTH || !KEY.test(key)) throw new Error(`Not a valid stored-file key: ${JSON.stringify(key.slice(0, 80))}.`);
  if (key === UPLOAD_TEMP_FOLDER || key.startsWith(`${UPLOAD_TEMP_FOLDER}/`)) throw new Error(`Stored-file keys may not lie under ${UPLOAD_TEMP_FOLDER}/ (request-scoped temporary files).`);
  return key;
}

/** A prefix for list(): empty, or a key-like path that may end in `/`. */
export function checkPrefix(prefix: string): string {
  if (prefix === '') return prefix;
  const bare = prefix.endsWith('/') ? prefix.slice(0, -1) : prefix;
  if (prefix.length > MAX_KEY_LENGTH || !KEY.test(bare)) throw new Error(`Not a valid stored-file prefix: ${JSON.stringify(prefix.slice(0, 80))}.`);
  return prefix;
}

/** The key an accepted DXF original is kept under: its SHA-256 (FIPS 180-4) in hex, as the data folder has always named it. */
export const originalDxfKey = (sha256: string) => `uploads/${sha256}.dxf`;
