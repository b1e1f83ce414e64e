import { GetObjectCommand, HeadBucketCommand, S3Client } from '@aws-sdk/client-s3';
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

/** Streams a body of unknown length to the bucket. */
export async function putObjectStream(key: string, body: Readable, contentType = 'application/octet-stream'): Promise<void> {
  const upload = new Upload({
    client: s3(),
    params: { Bucket: config().s3.bucket, Key: key, Body: body, ContentType: contentType },
    queueSize: 1,
    partSize: 5 * 1024 * 1024,
    leavePartsOnError: false,
  });
  await upload.done();
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
