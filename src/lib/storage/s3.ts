import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Readable } from 'node:stream';
import { config } from '../config';

let client: S3Client | null = null;

export function s3(): S3Client {
  const c = config().s3;
  client ??= new S3Client({
    endpoint: c.endpoint,
    region: c.region,
    credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
    forcePathStyle: true,
    // The SDK's default checksums use aws-chunked framing, which s3rver stores
    // inside the object: uploads would no longer be byte-identical.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
  return client;
}

/**
 * Streams a body of unknown length to the bucket. Aborting `signal` (or an
 * error of the body) stops the transfer and removes the parts already sent.
 */
export async function putObjectStream(key: string, body: Readable, contentType = 'application/octet-stream', signal?: AbortSignal): Promise<void> {
  const upload = new Upload({
    client: s3(),
    params: { Bucket: config().s3.bucket, Key: key, Body: body, ContentType: contentType },
    queueSize: 1,
    partSize: 5 * 1024 * 1024,
    leavePartsOnError: false,
  });
  const abort = () => void upload.abort().catch(() => undefined);
  signal?.addEventListener('abort', abort, { once: true });
  try {
    await upload.done();
  } finally {
    signal?.removeEventListener('abort', abort);
  }
}

/** Deletes objects; a key that is already gone is no error. Failures are left to the orphan sweep. */
export async function deleteObjects(keys: string[]): Promise<void> {
  await Promise.all(keys.map((Key) => s3().send(new DeleteObjectCommand({ Bucket: config().s3.bucket, Key })).catch(() => undefined)));
}

/** One page (up to 1,000) of the objects under a prefix, with their last-modified times. */
export async function listObjects(prefix: string, continuationToken?: string): Promise<{ objects: { key: string; lastModified: Date }[]; next: string | undefined }> {
  const res = await s3().send(new ListObjectsV2Command({ Bucket: config().s3.bucket, Prefix: prefix, ContinuationToken: continuationToken }));
  return {
    objects: (res.Contents ?? []).map((o) => ({ key: o.Key!, lastModified: o.LastModified ?? new Date(0) })),
    next: res.IsTruncated ? res.NextContinuationToken : undefined,
  };
}

export async function getObjectBytes(key: string): Promise<Uint8Array> {
  const res = await s3().send(new GetObjectCommand({ Bucket: config().s3.bucket, Key: key }));
  return res.Body!.transformToByteArray();
}

export async function getObjectStream(key: string): Promise<{ body: ReadableStream; length: number | undefined }> {
  const res = await s3().send(new GetObjectCommand({ Bucket: config().s3.bucket, Key: key }));
  return { body: res.Body!.transformToWebStream(), length: res.ContentLength };
}

export async function storageReachable(): Promise<boolean> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: config().s3.bucket }));
    return true;
  } catch {
    return false;
  }
}
