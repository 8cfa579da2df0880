import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Env } from '../config/env';
import { localDiskStorage } from './localDisk';
import { s3Storage } from './s3';
import type { ObjectStorage } from './storage';

export type { ObjectStorage } from './storage';

const repoRoot = fileURLToPath(new URL('../../../../', import.meta.url));

/** STORAGE_DRIVER=local (default, `.data/uploads`) or s3 (S3_BUCKET, S3_ENDPOINT, …). */
export function createStorage(env: Env): ObjectStorage {
  if (env.STORAGE_DRIVER === 's3') {
    if (!env.S3_BUCKET) throw new Error('STORAGE_DRIVER=s3 needs S3_BUCKET');
    return s3Storage({
      bucket: env.S3_BUCKET,
      region: env.S3_REGION,
      endpoint: env.S3_ENDPOINT,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
      forcePathStyle: env.S3_FORCE_PATH_STYLE === '1',
      prefix: env.S3_PREFIX,
    });
  }
  return localDiskStorage(env.UPLOADS_DIR ?? path.join(repoRoot, '.data/uploads'));
}
