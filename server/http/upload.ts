import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { env } from '../env.ts';
import { ensureParent, resolveInsideUploads, tmpDir } from '../media/paths.ts';
import { HttpError, badRequest } from './errors.ts';

/**
 * The one upload helper. Files stream to disk, never whole in memory: each file part is written as it arrives to
 * UPLOADS_DIR/tmp/upload-<random>.part (on the same file system as the masters, so the media pipeline can rename
 * a master into place instead of writing it again), and `req.file.path` / `req.files[i].path` name it. Every temp
 * file of a request is removed when its answer has been sent, whatever the outcome (`discardUploads`, also called
 * by the routes before they answer); the orphan reconciler (server/media/reconcile.ts) sweeps tmp/ of a process
 * that died mid-upload.
 *
 * Limits: a file over `maxBytes` or a request over UPLOAD_MAX_REQUEST_BYTES is 413 `too_large`; a process already
 * receiving UPLOAD_MAX_CONCURRENT uploads, or UPLOAD_MAX_PROCESS_BYTES declared bytes, answers 503 `uploads_busy`
 * with Retry-After (server/env.ts). multer's other refusals go through `refuse` (default: 400 "The upload could
 * not be read: …"). Anything else multer passes on is the form parser (busboy) refusing a malformed body — no
 * boundary, a truncated body, a bad part header — and is the sender's fault: 400 with busboy's reason, never a 500.
 * File names are read as UTF-8 (`defParamCharset`): busboy's default is Latin-1, which turned "Zürich" into
 * "ZÃ¼rich" (RFC 7578 §4.2: names are sent as UTF-8 by browsers).
 */
export type UploadOptions = {
  field: string;
  maxFiles: number;
  /** Per file; a function is read at each request (a limit tests may lower for a moment, server/media/limits.ts). */
  maxBytes: number | (() => number);
  maxFields: number;
  tooLarge: (err: multer.MulterError) => string;
  refuse?: (err: unknown) => HttpError | null;
};

/** Seconds a client should wait before sending an upload again after a 503 (common practice: a few seconds). */
export const UPLOAD_RETRY_AFTER_S = 5;

/**
 * What this process is receiving now. The limits are read from server/env.ts; tests may lower them or take a slot
 * themselves (`admit`) to check the refusals.
 */
export class UploadBudget {
  requests = 0;
  bytes = 0;
  constructor(
    public maxRequestBytes: number,
    public maxProcessBytes: number,
    public maxConcurrent: number,
  ) {}

  /** Takes a slot for an upload of `bytes` declared bytes, or answers null when the process is full. */
  admit(bytes: number): (() => void) | null {
    // A lone upload is always let in (it is within the per-request limit), so a low process limit cannot refuse all.
    if (this.requests >= this.maxConcurrent || (this.requests > 0 && this.bytes + bytes > this.maxProcessBytes))
      return null;
    this.requests += 1;
    this.bytes += bytes;
    let released = false;
    return () => {
      if (released) return;
      released = true;
      this.requests -= 1;
      this.bytes -= bytes;
    };
  }
}

export const uploadBudget = new UploadBudget(
  env.UPLOAD_MAX_REQUEST_BYTES,
  env.UPLOAD_MAX_PROCESS_BYTES,
  env.UPLOAD_MAX_CONCURRENT,
);

const mb = (bytes: number) => Math.round((bytes / 1024 / 1024) * 10) / 10;
const requestTooLarge = () =>
  new HttpError(
    413,
    'too_large',
    `The upload is larger than ${mb(uploadBudget.maxRequestBytes)} MB in all; send fewer or smaller files at once.`,
  );

/** The temp files one request has written (absolute paths), kept on the request. */
type Received = { bytes: number; paths: Set<string> };
const RECEIVED = Symbol('received uploads');
type WithReceived = Request & { [RECEIVED]?: Received };
const receivedOf = (req: Request): Received => {
  const r = req as WithReceived;
  return (r[RECEIVED] ??= { bytes: 0, paths: new Set() });
};

/** Removes every temp file of this request (idempotent; a file the media pipeline moved away is simply gone). */
export async function discardUploads(req: Request) {
  const received = (req as WithReceived)[RECEIVED];
  if (!received) return;
  const paths = [...received.paths];
  received.paths.clear();
  await Promise.all(paths.map((p) => rm(p, { force: true }).catch(() => undefined)));
}

/** multer storage engine: each file streams to its own temp file, counted against the request's byte limit. */
const tempFileStorage: multer.StorageEngine = {
  _handleFile(req, file, cb) {
    const received = receivedOf(req);
    const rel = path.posix.join(tmpDir(), `upload-${randomBytes(12).toString('hex')}.part`);
    const abs = resolveInsideUploads(rel);
    let size = 0;
    const count = new Transform({
      transform(chunk: Buffer, _enc, done) {
        size += chunk.length;
        received.bytes += chunk.length;
        done(received.bytes > uploadBudget.maxRequestBytes ? requestTooLarge() : null, chunk);
      },
    });
    ensureParent(rel)
      .then(() => {
        received.paths.add(abs);
        return pipeline(file.stream, count, createWriteStream(abs, { flags: 'wx' }));
      })
      .then(
        () => cb(null, { path: abs, size, destination: path.dirname(abs), filename: path.basename(abs) }),
        (err: unknown) => {
          void rm(abs, { force: true }).finally(() => cb(err as Error));
        },
      );
  },
  _removeFile(_req, file, cb) {
    rm(file.path, { force: true }).then(() => cb(null), cb);
  },
};

const reasonOf = (err: unknown) => (err instanceof Error ? err.message.replace(/\.$/, '') : 'malformed body');
const couldNotRead = (err: unknown) => badRequest(`The upload could not be read: ${reasonOf(err)}.`);

export function receiveUpload({
  field,
  maxFiles,
  maxBytes,
  maxFields,
  tooLarge,
  refuse = couldNotRead,
}: UploadOptions): RequestHandler {
  const receiverFor = (fileSize: number) => {
    const upload = multer({
      storage: tempFileStorage,
      defParamCharset: 'utf8',
      limits: { fileSize, files: maxFiles, fields: maxFields },
    });
    return maxFiles === 1 ? upload.single(field) : upload.array(field, maxFiles);
  };
  let current = { fileSize: -1, receive: receiverFor(0) };
  const receiverNow = () => {
    const fileSize = typeof maxBytes === 'function' ? maxBytes() : maxBytes;
    if (current.fileSize !== fileSize) current = { fileSize, receive: receiverFor(fileSize) };
    return current.receive;
  };
  return (req, res, next) => {
    const receive = receiverNow();
    const declared = Number(req.headers['content-length']);
    const known = req.headers['content-length'] !== undefined && Number.isFinite(declared);
    // Refused before a byte is read; the rest of the body is read and dropped so the client sees the answer.
    const refuseNow = (err: HttpError) => {
      req.resume();
      next(err);
    };
    if (known && declared > uploadBudget.maxRequestBytes) return refuseNow(requestTooLarge());
    const release = uploadBudget.admit(known ? declared : uploadBudget.maxRequestBytes);
    if (!release) {
      res.set('Retry-After', String(UPLOAD_RETRY_AFTER_S));
      return refuseNow(
        new HttpError(
          503,
          'uploads_busy',
          `The server is receiving as many uploads as it can take at once; try again in ${UPLOAD_RETRY_AFTER_S} seconds.`,
        ),
      );
    }
    // Whatever happens next (answer sent, client gone), the slot is given back and the temp files removed.
    res.once('close', () => {
      release();
      void discardUploads(req);
    });
    receive(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE')
        return next(new HttpError(413, 'too_large', tooLarge(err)));
      if (err instanceof HttpError) return next(err);
      next(refuse(err) ?? couldNotRead(err));
    });
  };
}
