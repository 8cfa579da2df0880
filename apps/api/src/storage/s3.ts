import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client, NoSuchKey } from '@aws-sdk/client-s3';
import { assertSafeKey, type ObjectStorage } from './storage';

export interface S3Options {
  bucket: string;
  region: string;
  endpoint?: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle?: boolean;
  /** prefix inside the bucket, e.g. "barmkeep/" */
  prefix?: string;
}

/** Any S3-compatible store. Objects stay private: the API streams them to people allowed to see them. */
export function s3Storage(o: S3Options): ObjectStorage & { client: S3Client } {
  const client = new S3Client({
    region: o.region,
    ...(o.endpoint ? { endpoint: o.endpoint } : {}),
    forcePathStyle: o.forcePathStyle ?? Boolean(o.endpoint),
    ...(o.accessKeyId && o.secretAccessKey
      ? { credentials: { accessKeyId: o.accessKeyId, secretAccessKey: o.secretAccessKey } }
      : {}),
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Key = (key: string) => `${o.prefix ?? ''}${assertSafeKey(key)}`;
  return {
    driver: 's3',
    client,
    async put(key, body, contentType) {
      await client.send(
        new PutObjectCommand({ Bucket: o.bucket, Key: Key(key), Body: body, ContentType: contentType }),
      );
    },
    async get(key) {
      try {
        const res = await client.send(new GetObjectCommand({ Bucket: o.bucket, Key: Key(key) }));
        if (!res.Body) return null;
        return Buffer.from(await res.Body.transformToByteArray());
      } catch (err) {
        if (err instanceof NoSuchKey || (err as { name?: string }).name === 'NoSuchKey') return null;
        throw err;
      }
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket: o.bucket, Key: Key(key) }));
    },
  };
}
