import type { FileStore } from './file-store';
import { localFileStore } from './local-store';
import { s3FileStore, type S3Settings } from './s3-store';

/** The store the configuration asks for: the bucket when S3_URL is set, else the data folder. */
export function createFileStore(config: { dataDir: string; s3: S3Settings | undefined }): FileStore {
  return config.s3 ? s3FileStore(config.s3) : localFileStore(config.dataDir);
}
