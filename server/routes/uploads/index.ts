import path from 'node:path';
import { readdir, rm, stat } from 'node:fs/promises';
import type { Request as ExpressRequest, RequestHandler } from 'express';
import { Server, type Upload } from '@tus/server';
import { FileStore } from '@tus/file-store';
import { env } from '../../env.ts';
import { actorOf } from '../../http/auth.ts';
import { HttpError, forbidden, notFound } from '../../http/errors.ts';
import { maxBytesInWords, mediaLimits } from '../../media/limits.ts';
import { checkUpload } from '../../media/pipeline.ts';
import { uploadsDir } from '../../media/paths.ts';
import { sequelize } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { addPhoto } from '../../services/photos.ts';
import { loadReadablePiece } from '../pieces/load.ts';
import { loadWritableTrial } from '../trials/load.ts';

/**
 * Resumable uploads (issue 18): the tus 1.0 protocol at /api/uploads (@tus/server with @tus/file-store). Mounted
 * behind the API's own middleware (Host and Origin checks, the session), for signed-in users only. The target goes in
 * Upload-Metadata: `pieceId` (a photo of a piece: photo:create on it) or `trialId` (a swatch: the trial's dyer), and
 * `filename`; it is checked when the upload is created, and only its creator may resume (HEAD, PATCH) or end it. On
 * the last PATCH the file is checked by content and stored through the same service as the multipart route
 * (checkUpload, addPhoto: one code path for the master), and the answer carries the photo's id in `Photo-Id`.
 * Partial files live under TUS_DIR; one untouched for TUS_EXPIRY_HOURS expires (sweepExpiredUploads).
 */
export const TUS_PATH = '/api/uploads';
export const PHOTO_ID_HEADER = 'Photo-Id';

export const tusDir = () => path.resolve(env.TUS_DIR ?? path.join(uploadsDir(), 'incoming', 'tus'));
/** The partial uploads' store (exported for the expiry test, which shortens its expiry for a moment). */
export const tusStore = new FileStore({
  directory: tusDir(),
  expirationPeriodInMilliseconds: env.TUS_EXPIRY_HOURS * 3_600_000,
});

/** A refusal in the API's own JSON shape, as tus sends it (status and body). */
const refusal = (err: HttpError) => ({
  status_code: err.status,
  body: JSON.stringify({ error: { code: err.code, message: err.message } }),
});

const expressOf = (req: Request) =>
  (req as Request & { runtime?: { node?: { req: ExpressRequest } } }).runtime?.node?.req;

type SignedIn = NonNullable<Actor>;

function actorIn(req: Request): SignedIn {
  const node = expressOf(req);
  const actor = node ? actorOf(node) : null;
  if (!actor) throw refusal(new HttpError(401, 'unauthenticated', 'Sign in to upload photos.'));
  return actor;
}

/** The photo's target from Upload-Metadata, checked as the multipart routes check it. */
async function target(actor: SignedIn, metadata: Upload['metadata']) {
  const pieceId = Number(metadata?.pieceId);
  const trialId = Number(metadata?.trialId);
  if (Number.isSafeInteger(pieceId) && pieceId > 0) {
    const piece = await loadReadablePiece(actor, pieceId);
    if (piece.deletedAt) throw notFound('Piece');
    if (!can(actor, 'photo:create', pieceRecord(piece))) throw forbidden();
    return { pieceId: piece.id };
  }
  if (Number.isSafeInteger(trialId) && trialId > 0) {
    const trial = await loadWritableTrial(actor, trialId);
    return { trialId: trial.id, view: 'swatch' as const };
  }
  throw new HttpError(400, 'invalid_input', 'Name the piece (pieceId) or the trial (trialId) in Upload-Metadata.');
}

const asTus = async <T>(fn: () => Promise<T>) => {
  try {
    return await fn();
  } catch (err) {
    throw err instanceof HttpError ? refusal(err) : err;
  }
};

export const tusServer = new Server({
  path: TUS_PATH,
  datastore: tusStore,
  relativeLocation: true,
  exposedHeaders: [PHOTO_ID_HEADER],
  maxSize: () => mediaLimits.maxBytes,
  async onUploadCreate(req, upload) {
    const actor = actorIn(req);
    return asTus(async () => {
      await target(actor, upload.metadata);
      if (upload.size !== undefined && upload.size > mediaLimits.maxBytes)
        throw new HttpError(413, 'too_large', `The file is larger than ${maxBytesInWords()}.`);
      // The creator, set here (never taken from the client): only they may resume or end the upload.
      return { metadata: { ...upload.metadata, userId: String(actor.id) } };
    });
  },
  async onIncomingRequest(req, uploadId) {
    const actor = actorIn(req);
    if (!uploadId) return;
    const upload = await tusStore.getUpload(uploadId).catch(() => null);
    // Someone else's upload is answered as if it did not exist.
    if (upload && upload.metadata?.userId !== String(actor.id))
      throw refusal(new HttpError(404, 'not_found', 'Upload not found.'));
  },
  async onUploadFinish(req, upload) {
    const actor = actorIn(req);
    return asTus(async () => {
      const file = path.join(tusDir(), upload.id);
      try {
        // Checked again when it ends: the piece or trial may have changed meanwhile.
        const into = await target(actor, upload.metadata);
        const checked = await checkUpload({ path: file });
        const originalName = upload.metadata?.filename ?? null;
        const { photo } = await sequelize.transaction((transaction) =>
          addPhoto({ actor, transaction, input: { path: file, originalName, checked, ...into } }),
        );
        return { headers: { [PHOTO_ID_HEADER]: String(photo.id) } };
      } finally {
        // The file was renamed to the master's temp name (or refused): the partial file and its metadata go.
        await rm(file, { force: true });
        await rm(`${file}.json`, { force: true });
      }
    });
  },
});

/** Express handler: tus reads the path from req.url, which a mounted router shortens. */
export const tusHandler: RequestHandler = (req, res, next) => {
  req.url = req.originalUrl;
  tusServer.handle(req, res).catch(next);
};

/**
 * Removes uploads untouched for TUS_EXPIRY_HOURS (the file store's expiry), and files left without their metadata
 * (a process killed at creation) once as old. Run with the orphan sweep (server start and the fixity check).
 */
export async function sweepExpiredUploads(now = Date.now()) {
  const removed = await tusStore.deleteExpired().catch(() => 0);
  let strays = 0;
  const dir = tusDir();
  const names = await readdir(dir).catch(() => [] as string[]);
  for (const name of names) {
    if (name.endsWith('.json') || names.includes(`${name}.json`)) continue;
    const info = await stat(path.join(dir, name)).catch(() => null);
    if (info && now - info.mtimeMs > tusStore.getExpiration()) {
      await rm(path.join(dir, name), { force: true });
      strays += 1;
    }
  }
  return removed + strays;
}
