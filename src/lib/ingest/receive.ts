// Receiving ride files: a multipart request is read chunk by chunk into
// busboy, and each file streams straight to object storage with its SHA-256
// computed on the way; nothing is held in memory beyond the storage client's
// part buffer. Every stream's error is handled: a client that goes away, a
// file over the limit or a store that fails ends the request with its own
// answer, never the process. Either every file of the request is stored or
// none is: on any failure the transfers in progress are aborted and the
// objects already written are removed before the error is answered.
import busboy from 'busboy';
import { createHash, randomUUID } from 'node:crypto';
import { once, setMaxListeners } from 'node:events';
import { PassThrough, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { HttpError, badRequest } from '../http/errors';
import { discardRest } from '../http/request';
import { deleteObjects, putObjectStream } from '../storage/s3';
import { cleanFileName } from './file-name';

export const MAX_FILE_BYTES = 25 * 1024 * 1024;
export const MAX_FILES = 50;
const MAX_FIELDS = 200;
const MAX_FIELD_BYTES = 4096;
/** Bytes of a file's start that `sniff` is given. */
const HEAD_BYTES = 16;

export interface StoredFile {
  name: string;
  storageKey: string;
  sha256: string;
  byteSize: number;
  contentType: string;
}

export interface ReceivedUpload {
  fields: Record<string, string[]>;
  files: StoredFile[];
}

/** What one kind of upload accepts; ride files and clearance documents share the code below. */
export interface ReceiveRules {
  /** The multipart field that carries the files. */
  field: string;
  maxFileBytes: number;
  maxFiles: number;
  /** Words for the refusals: "ride file", "clearance document". */
  what: string;
  tooLarge: (name: string) => HttpError;
  /** The type stored with each object, unless `sniff` decides it. */
  contentType: string;
  /**
   * Decides a file by its first bytes (at most HEAD_BYTES; fewer for a shorter
   * file): returns the content type to store it as, or throws the refusal.
   * The transfer to storage starts only after it, so a refused file stores nothing.
   */
  sniff?: (head: Buffer, name: string) => string;
}

const tooLarge = (name: string) =>
  new HttpError(413, 'too_large', `"${name}" is larger than 25 MB, the most Kinloop accepts for one ride file. Nothing from this upload was saved; check that it is a ride file from the cycle.`);

export const RIDE_FILES: ReceiveRules = { field: 'files', maxFileBytes: MAX_FILE_BYTES, maxFiles: MAX_FILES, what: 'ride file', tooLarge, contentType: 'text/csv' };

export const storageUnavailable = () =>
  new HttpError(503, 'storage_unavailable', 'The file store is not reachable right now, so nothing was saved. Try the upload again in a few minutes.');

/** The client went away mid-request: nobody reads the answer, but the request ends as a refusal. */
export class UploadInterrupted extends HttpError {
  constructor(received: number) {
    super(400, 'upload_interrupted', `The upload stopped after ${received} bytes, before the whole request arrived. Nothing was saved; send the files again.`);
  }
}

/**
 * Streams the request's files to storage. `beforeFirstFile` runs once, when
 * the first file starts, with the fields read so far and the request's
 * declared length: the caller checks there that it may store files for them
 * (so `clientId` must come before the files, as the upload page sends it) and
 * returns the key prefix to store them under.
 */
export function receiveRideFiles(
  request: Request,
  beforeFirstFile: (fields: Record<string, string[]>, declaredBytes: number) => Promise<string>,
): Promise<ReceivedUpload> {
  return receiveFiles(request, RIDE_FILES, beforeFirstFile);
}

/** Streams the request's files to storage under `rules`; see `receiveRideFiles`. */
export async function receiveFiles(
  request: Request,
  rules: ReceiveRules,
  beforeFirstFile: (fields: Record<string, string[]>, declaredBytes: number) => Promise<string>,
): Promise<ReceivedUpload> {
  const { field, maxFileBytes, maxFiles, what } = rules;
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw new HttpError(415, 'unsupported_media_type', `Send the ${what} as multipart/form-data in the field "${field}".`);
  }
  const declared = Number(request.headers.get('content-length') ?? 0) || 0;
  if (declared > maxFiles * (maxFileBytes + 64 * 1024)) {
    if (request.body) discardRest(request.body.getReader());
    throw new HttpError(413, 'too_large', `This upload is larger than Kinloop accepts in one request (${maxFiles} ${maxFiles === 1 ? 'file' : 'files'} of at most ${Math.round(maxFileBytes / 1024 / 1024)} MB). Nothing was saved.`);
  }
  if (!request.body) throw badRequest(`The upload was empty: choose a ${what}.`);

  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers: Object.fromEntries(request.headers),
      // File names are UTF-8 as browsers send them, not Latin-1.
      defParamCharset: 'utf8',
      // One byte over the limit is how busboy tells a file that is too large from one exactly at it.
      limits: { fileSize: maxFileBytes + 1, files: maxFiles, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES, parts: maxFiles + MAX_FIELDS },
    });
  } catch (err) {
    throw badRequest(`The upload could not be read as multipart/form-data: ${(err as Error).message}`);
  }

  const fields: Record<string, string[]> = {};
  const stored: (StoredFile & { index: number })[] = [];
  const transfers: Promise<void>[] = [];
  const abort = new AbortController();
  // Each file's pipeline and transfer listen to the one signal.
  setMaxListeners(4 * maxFiles + 10, abort.signal);
  let failure: unknown = null;
  let signalFailure: () => void = () => undefined;
  const failed = new Promise<void>((resolve) => (signalFailure = resolve));
  const fail = (err: unknown) => {
    if (failure) return;
    failure = err;
    abort.abort();
    signalFailure();
  };
  let checked: Promise<string> | null = null;
  let arrivals = 0;

  parser.on('field', (name, value, info) => {
    if (info.valueTruncated) fail(badRequest(`The field "${name.slice(0, 40)}" is longer than ${MAX_FIELD_BYTES} bytes.`));
    (fields[name] ??= []).push(value);
  });
  parser.on('filesLimit', () => fail(new HttpError(413, 'too_many_files', `Upload at most ${maxFiles} ${maxFiles === 1 ? 'file' : 'files'} at a time. Nothing from this upload was saved.`)));
  parser.on('fieldsLimit', () => fail(badRequest(`The upload has more than ${MAX_FIELDS} fields.`)));
  parser.on('partsLimit', () => fail(badRequest(`The upload has more parts than an upload of a ${what} has.`)));
  parser.on('error', (err: Error) => fail(badRequest(`The upload could not be read as multipart/form-data: ${err.message}`)));
  parser.on('file', (fieldName, stream, info) => {
    // Every file stream has a listener for its errors, whatever happens to it next.
    stream.on('error', () => undefined);
    const name = cleanFileName(info.filename);
    if (failure || fieldName !== field) {
      if (fieldName !== field) fail(badRequest(`Unexpected file field "${fieldName.slice(0, 40)}": send the ${what} in the field "${field}".`));
      stream.resume();
      return;
    }
    const index = arrivals++;
    checked ??= beforeFirstFile(fields, declared);
    const hash = createHash('sha256');
    let size = 0;
    let head = Buffer.alloc(0);
    let headSeen: (head: Buffer) => void = () => undefined;
    const headKnown = new Promise<Buffer>((resolve) => (headSeen = resolve));
    const meter = new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        size += chunk.length;
        if (head.length < HEAD_BYTES) {
          head = Buffer.concat([head, chunk.subarray(0, HEAD_BYTES - head.length)]);
          if (head.length >= HEAD_BYTES) headSeen(head);
        }
        done(null, chunk);
      },
      flush(done) {
        headSeen(head);
        done();
      },
    });
    stream.on('limit', () => fail(rules.tooLarge(name)));
    const body = new PassThrough();
    // The bytes flow into `body` while the access check runs; the transfer to storage starts after it.
    const flowing = pipeline(stream, meter, body, { signal: abort.signal });
    flowing.catch(() => undefined).finally(() => headSeen(head));
    const transfer = (async () => {
      let prefix: string;
      try {
        prefix = await checked!;
      } catch (err) {
        fail(err);
        return;
      }
      if (failure) return;
      let contentType = rules.contentType;
      if (rules.sniff) {
        const start = await headKnown;
        if (failure) return;
        try {
          contentType = rules.sniff(start, name);
        } catch (err) {
          fail(err);
          return;
        }
      }
      const key = `${prefix}/${randomUUID()}`;
      try {
        await Promise.all([putObjectStream(key, body, contentType, abort.signal), flowing]);
      } catch (err) {
        if (!failure) fail(err instanceof HttpError ? err : storageUnavailable());
        // An abort may come after the store took the last part: the object is removed with the others.
        stored.push({ index, name, storageKey: key, sha256: '', byteSize: size, contentType });
        return;
      }
      stored.push({ index, name, storageKey: key, sha256: hash.digest('hex'), byteSize: size, contentType });
    })();
    transfers.push(transfer);
  });

  const reader = request.body.getReader();
  const received = await pump(reader, parser, failed, () => failure !== null);
  if (received.error) fail(new UploadInterrupted(received.bytes));
  if (failure) {
    // Busboy is left unfinished: its file streams end with it.
    parser.destroy();
    // Refused before the body ended: the answer goes out now, and the rest is dropped unread.
    if (!received.error && !received.complete) discardRest(reader);
  }
  await Promise.all(transfers);
  if (!failure && stored.length === 0) failure = badRequest(`The upload had no ${what}: choose a file in the field "${field}".`);
  if (failure) {
    await deleteObjects(stored.map((f) => f.storageKey));
    if (failure instanceof UploadInterrupted) console.warn(`upload interrupted after ${received.bytes} bytes; ${stored.length} partly stored file(s) removed`);
    throw failure;
  }
  // Storage may finish files out of order; per-file fields follow the order they were sent in.
  stored.sort((a, b) => a.index - b.index);
  return { fields, files: stored.map(({ index: _, ...f }) => f) };
}

/**
 * Feeds the request body to busboy, chunk by chunk, waiting for busboy to take
 * each one. Stops at once when `stopped()` turns true (a refusal; the rest of
 * the body is never read) and returns, rather than throws, when the client
 * goes away.
 */
async function pump(
  reader: ReadableStreamDefaultReader<Uint8Array>,
  parser: busboy.Busboy,
  failed: Promise<void>,
  stopped: () => boolean,
): Promise<{ bytes: number; complete: boolean; error: unknown }> {
  let bytes = 0;
  let complete = false;
  try {
    for (;;) {
      if (stopped()) return { bytes, complete, error: null };
      const next = await Promise.race([reader.read(), failed.then(() => null)]);
      if (next === null) return { bytes, complete, error: null };
      if (next.done) break;
      bytes += next.value.byteLength;
      if (!parser.write(next.value)) await Promise.race([once(parser, 'drain'), failed]);
    }
    complete = true;
    parser.end();
    await Promise.race([once(parser, 'close'), failed]);
    return { bytes, complete, error: null };
  } catch (err) {
    // Busboy's own errors are reported through its 'error' listener; anything else here is the request stream failing.
    return { bytes, complete, error: stopped() ? null : err };
  }
}
