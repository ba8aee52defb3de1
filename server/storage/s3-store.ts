import { Readable } from 'node:stream';
import {
  DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client,
} from '@aws-sdk/client-s3';
import { checkKey, checkPrefix, isKey, MAX_GET_BYTES, StoreError, type FileStore, type StoredFile } from './file-store';

/** Where the bucket is and how to sign in to it: parsed from S3_URL and friends by server/config.ts. */
export interface S3Settings {
  /** http(s)://host:port of the S3-compatible service. */
  endpoint: string;
  bucket: string;
  /** Prepended to every key ('' or ending in '/'), so several Gridsets can share one bucket. */
  prefix: string;
  region: string;
  /** Omitted: the AWS SDK's default chain (AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY, profiles, instance roles). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
}

const status = (err: unknown) => (err as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode;
const isMissing = (err: unknown) => status(err) === 404 || ['NoSuchKey', 'NotFound'].includes(String((err as { name?: unknown })?.name));

/** Reads a stream whole, refusing more than max bytes. */
async function readAll(body: Readable, max: number, key: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let n = 0;
  for await (const c of body) {
    n += (c as Buffer).length;
    if (n > max) {
      body.destroy();
      throw new StoreError(`The stored file ${key} is more than the ${max} bytes read at once.`);
    }
    chunks.push(c as Buffer);
  }
  return Buffer.concat(chunks);
}

/**
 * A bucket of S3-compatible object storage (any service that speaks the S3 API) through the AWS SDK for
 * JavaScript v3. Path-style addresses (http://host:port/bucket/key) work with every such service on a
 * shop network, where bucket-name DNS entries rarely exist. Checksums are computed only when an
 * operation requires them: the SDK's default (CRC32 on every upload, sent as an aws-chunked body) is
 * refused or mis-stored by older S3-compatible servers.
 */
export function s3FileStore(s: S3Settings): FileStore & { client: S3Client } {
  const client = new S3Client({
    endpoint: s.endpoint,
    region: s.region,
    credentials: s.credentials,
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 3,
  });
  const Bucket = s.bucket;
  const objectKey = (key: string) => s.prefix + checkKey(key);
  const location = `s3://${s.bucket}/${s.prefix} at ${s.endpoint}`;
  /** Any failure but a missing object means the storage cannot be used right now: a 503 with a sentence. */
  const unavailable = (what: string, err: unknown) => {
    const why = err instanceof Error ? err.message || err.name : String(err);
    return new StoreError(`The file storage (${location}) could not ${what}: ${why}`, err);
  };

  async function stream(key: string): Promise<{ body: Readable; size: number } | null> {
    const Key = objectKey(key);
    try {
      const r = await client.send(new GetObjectCommand({ Bucket, Key }));
      if (!r.Body) return null;
      return { body: r.Body as Readable, size: Number(r.ContentLength ?? 0) };
    } catch (err) {
      if (isMissing(err)) return null;
      throw unavailable(`read ${key}`, err);
    }
  }

  return {
    kind: 's3',
    location,
    client,

    async put(key, body, opts) {
      const Key = objectKey(key);
      if (!Buffer.isBuffer(body) && !(typeof opts?.size === 'number')) throw new Error('A stream put into object storage needs its size.');
      try {
        await client.send(new PutObjectCommand({
          Bucket, Key, Body: body, ContentType: opts?.contentType ?? 'application/octet-stream',
          ContentLength: Buffer.isBuffer(body) ? body.length : opts!.size,
        }));
      } catch (err) {
        throw unavailable(`keep ${key}`, err);
      }
    },

    async get(key, opts) {
      const max = opts?.maxBytes ?? MAX_GET_BYTES;
      const found = await stream(key);
      if (!found) return null;
      if (found.size > max) {
        found.body.destroy();
        throw new StoreError(`The stored file ${key} is ${found.size} bytes, more than the ${max} bytes read at once.`);
      }
      return readAll(found.body, max, key);
    },

    stream,

    async has(key) {
      const Key = objectKey(key);
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key }));
        return true;
      } catch (err) {
        if (isMissing(err)) return false;
        throw unavailable(`look for ${key}`, err);
      }
    },

    async delete(key) {
      const Key = objectKey(key);
      try {
        await client.send(new DeleteObjectCommand({ Bucket, Key }));
      } catch (err) {
        if (isMissing(err)) return;
        throw unavailable(`remove ${key}`, err);
      }
    },

    async list(prefix) {
      checkPrefix(prefix);
      const out: StoredFile[] = [];
      let ContinuationToken: string | undefined;
      try {
        do {
          const r = await client.send(new ListObjectsV2Command({ Bucket, Prefix: s.prefix + prefix, ContinuationToken }));
          for (const o of r.Contents ?? []) {
            const key = (o.Key ?? '').slice(s.prefix.length);
            if (o.Key?.startsWith(s.prefix) && isKey(key)) out.push({ key, size: Number(o.Size ?? 0) });
          }
          ContinuationToken = r.IsTruncated ? r.NextContinuationToken : undefined;
        } while (ContinuationToken);
      } catch (err) {
        throw unavailable(`list ${prefix || 'its files'}`, err);
      }
      return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
    },

    async check() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch (err) {
        const code = status(err);
        throw new StoreError(code === 404 ? `the bucket ${Bucket} does not exist at ${s.endpoint}; create it, or correct S3_URL.`
          : code === 403 || code === 401 ? `the bucket ${Bucket} at ${s.endpoint} refuses these credentials; check S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY and the key's permissions.`
            : `the bucket ${Bucket} at ${s.endpoint} cannot be reached (${err instanceof Error ? err.message || err.name : String(err)}); check S3_URL and the network.`, err);
      }
    },
  };
}
