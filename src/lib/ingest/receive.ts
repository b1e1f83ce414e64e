// Receiving ride files: a multipart request is streamed, file by file, straight
// to object storage with its SHA-256 computed on the way; nothing is held in
// memory beyond the storage client's part buffer. Either every file of the
// request is stored or none is: on any failure the objects already written are
// removed before the error is answered.
import { DeleteObjectCommand } from '@aws-sdk/client-s3';
import busboy from 'busboy';
import { createHash, randomUUID } from 'node:crypto';
import { PassThrough, Readable, Transform } from 'node:stream';
import { config } from '../config';
import { HttpError, badRequest } from '../http/errors';
import { putObjectStream, s3 } from '../storage/s3';

export const MAX_FILE_BYTES = 25 * 1024 * 1024;
export const MAX_FILES = 50;

export interface StoredFile {
  name: string;
  storageKey: string;
  sha256: string;
  byteSize: number;
}

export interface ReceivedUpload {
  fields: Record<string, string[]>;
  files: StoredFile[];
}

const tooLarge = (name: string) =>
  new HttpError(413, 'too_large', `"${name}" is larger than 25 MB, the most Kinloop accepts for one ride file. Nothing from this upload was saved; check that it is a ride file from the cycle.`);

export const storageUnavailable = () =>
  new HttpError(503, 'storage_unavailable', 'The file store is not reachable right now, so nothing was saved. Try the upload again in a few minutes.');

/**
 * Streams the request's files to storage under `keyPrefix`. `beforeFirstFile`
 * runs once, when the first file starts, with the fields read so far: the
 * caller checks there that it may store files for them (so `clientId` must
 * come before the files, as the upload page sends it).
 */
export async function receiveRideFiles(
  request: Request,
  keyPrefix: (fields: Record<string, string[]>) => string,
  beforeFirstFile: (fields: Record<string, string[]>) => Promise<void>,
): Promise<ReceivedUpload> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw new HttpError(415, 'unsupported_media_type', 'Send ride files as multipart/form-data with the field "files".');
  }
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > MAX_FILES * MAX_FILE_BYTES + 1024 * 1024) {
    throw new HttpError(413, 'too_large', 'This upload is larger than Kinloop accepts in one request (50 files of at most 25 MB). Nothing was saved.');
  }
  if (!request.body) throw badRequest('The upload was empty: choose at least one ride file.');

  const fields: Record<string, string[]> = {};
  const stored: (StoredFile & { index: number })[] = [];
  let arrivals = 0;
  const pending: Promise<void>[] = [];
  let failure: unknown = null;
  let checked: Promise<void> | null = null;
  const fail = (err: unknown) => {
    failure ??= err;
  };

  const parser = busboy({
    headers: Object.fromEntries(request.headers),
    limits: { fileSize: MAX_FILE_BYTES, files: MAX_FILES, fields: 200, fieldSize: 4096, parts: MAX_FILES + 200 },
  });

  parser.on('field', (name, value) => {
    (fields[name] ??= []).push(value);
  });
  parser.on('filesLimit', () => fail(new HttpError(413, 'too_many_files', `Upload at most ${MAX_FILES} files at a time. Nothing from this upload was saved.`)));
  parser.on('file', (fieldName, stream, info) => {
    const name = (info.filename || 'ride.csv').slice(0, 255);
    if (failure || fieldName !== 'files') {
      if (fieldName !== 'files') fail(badRequest(`Unexpected file field "${fieldName}": send ride files in the field "files".`));
      stream.resume();
      return;
    }
    const index = arrivals++;
    checked ??= beforeFirstFile(fields);
    const hash = createHash('sha256');
    let size = 0;
    const meter = new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        size += chunk.length;
        done(null, chunk);
      },
    });
    let truncated = false;
    stream.on('limit', () => {
      truncated = true;
      fail(tooLarge(name));
    });
    const body = new PassThrough();
    stream.pipe(meter).pipe(body);
    const file = checked.then(async () => {
      const key = `${keyPrefix(fields)}/${randomUUID()}`;
      try {
        await putObjectStream(key, body, 'text/csv');
      } catch (err) {
        // The bytes the storage client did not take must still be read, or the request stalls.
        body.resume();
        fail(err instanceof HttpError ? err : storageUnavailable());
        return;
      }
      stored.push({ index, name, storageKey: key, sha256: hash.digest('hex'), byteSize: size });
      if (truncated) fail(tooLarge(name));
    });
    file.catch((err) => {
      body.resume();
      fail(err);
    });
    pending.push(file.catch(() => undefined));
  });

  const done = new Promise<void>((resolve, reject) => {
    parser.on('close', resolve);
    parser.on('error', (err: Error) => reject(badRequest(`The upload could not be read as multipart/form-data: ${err.message}`)));
  });
  try {
    Readable.fromWeb(request.body as import('node:stream/web').ReadableStream).pipe(parser);
    await done;
  } catch (err) {
    fail(err);
  }
  await Promise.all(pending);
  if (!failure && stored.length === 0) failure = badRequest('The upload had no ride file: choose at least one file in the field "files".');
  if (failure) {
    await removeObjects(stored.map((f) => f.storageKey));
    throw failure;
  }
  // Storage may finish files out of order; per-file fields follow the order they were sent in.
  stored.sort((a, b) => a.index - b.index);
  return { fields, files: stored.map(({ index: _, ...f }) => f) };
}

export async function removeObjects(keys: string[]): Promise<void> {
  await Promise.all(
    keys.map((Key) => s3().send(new DeleteObjectCommand({ Bucket: config().s3.bucket, Key })).catch(() => undefined)),
  );
}
