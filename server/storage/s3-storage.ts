import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Env } from '@server/env.ts';
import type { FileStorage } from './file-storage.ts';

type S3Settings = Pick<Env, 'S3_ENDPOINT' | 'S3_BUCKET' | 'S3_REGION' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY' | 'S3_FORCE_PATH_STYLE'>;

/**
 * S3 storage: the local fake in development, AWS S3 (or any S3-compatible store) when
 * the S3_* variables point there. Checksums only when required: with the default,
 * streamed uploads to the local fake are stored with aws-chunked framing.
 */
export function createS3Storage(env: S3Settings): FileStorage & { client: S3Client } {
  const client = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = env.S3_BUCKET;
  const read: FileStorage['read'] = async (key) => {
    try {
      const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      const body = out.Body ? Buffer.from(await out.Body.transformToByteArray()) : Buffer.alloc(0);
      return { body, contentType: out.ContentType ?? null, contentDisposition: out.ContentDisposition ?? null };
    } catch (error) {
      if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null;
      throw error;
    }
  };
  return {
    client,
    async put(key, body, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }));
    },
    async putStream(key, body, props) {
      await client.send(
        new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: props.contentType, ContentLength: props.byteLength, ContentDisposition: props.contentDisposition }),
      );
    },
    read,
    async get(key) {
      return (await read(key))?.body ?? null;
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
    async *list(prefix) {
      let ContinuationToken: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken }));
        for (const o of page.Contents ?? []) if (o.Key) yield { key: o.Key, lastModified: o.LastModified ?? new Date(0) };
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
    },
    signedUrl: (key, expiresIn = 900) => getSignedUrl(client, new GetObjectCommand({ Bucket, Key: key }), { expiresIn }),
    async check() {
      await client.send(new HeadBucketCommand({ Bucket }));
    },
  };
}
