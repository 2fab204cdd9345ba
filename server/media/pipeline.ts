import { createHash, randomBytes } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import sharp, { type Metadata } from 'sharp';
import type { Transaction } from 'sequelize';
import { HttpError } from '../http/errors.ts';
import { PaletteColour, Photo, sequelize } from '../models/index.ts';
import { INGEST_STEPS, type IngestStep } from '../../shared/schemas/ingest.ts';
import { buildTiles } from '../iiif/tiles.ts';
import type { PhotoView } from '../models/catalogue.ts';
import { colourSource, decodeForIngest, type ColourSource, type ImageInput } from './decode.ts';
import { readExif } from './exif.ts';
import { exists, masterFileOnDisk, moveIntoPlace, tempMasterPath, WrittenFiles } from './files.ts';
import type { RawImage } from './palette.ts';
import { maxBytesInWords, maxPixelsInWords, mediaLimits } from './limits.ts';
import { derivativePath, derivativesDir, masterPath, tilesDir } from './paths.ts';
import { storage } from '../storage/index.ts';
import type { ServiceCtx } from '../services/context.ts';
import { repalette } from './repalette.ts';
export { repalette };

export const DERIVATIVES = { thumb: 320, display: 1600 } as const;

const FORMATS: Record<string, string> = { jpeg: 'jpg', png: 'png', tiff: 'tif', webp: 'webp', heif: 'heic' };

/**
 * The photo's bytes, or (an upload streamed to disk, server/http/upload.ts) the absolute path of its temp file,
 * which the pipeline reads from and then renames into place as the master: never read whole into memory.
 */
export type IngestSource = { buffer: Buffer; path?: undefined } | { path: string; buffer?: undefined };
export type IngestInput = IngestSource & {
  originalName?: string | null;
  pieceId?: number | null;
  trialId?: number | null;
  view?: PhotoView;
};

/** Format and upright size, decided by content; refuses what is not a supported image. */
async function probe(input: ImageInput, bytes: number) {
  if (bytes === 0) throw new HttpError(422, 'empty_file', 'The file is empty.');
  if (bytes > mediaLimits.maxBytes)
    throw new HttpError(413, 'too_large', `The file is larger than ${maxBytesInWords()}.`);
  let meta: Metadata;
  try {
    meta = await sharp(input, { limitInputPixels: false }).metadata();
  } catch (err) {
    if (/unsupported image format/i.test(String(err)))
      throw new HttpError(
        415,
        'unsupported_type',
        'This file is not an image in a supported format (JPEG, PNG, TIFF, WebP, HEIF/AVIF).',
      );
    throw new HttpError(422, 'corrupt_image', 'The image file is damaged and cannot be read.');
  }
  const format = meta.format ?? '';
  if (!FORMATS[format])
    throw new HttpError(
      415,
      'unsupported_type',
      `Images of type ${format || 'unknown'} are not accepted; use JPEG, PNG, TIFF, WebP or HEIF/AVIF.`,
    );
  if (!meta.width || !meta.height) throw new HttpError(422, 'corrupt_image', 'The image has no size.');
  if (meta.width * meta.height > mediaLimits.maxPixels) {
    throw new HttpError(
      422,
      'pixel_limit',
      `The image is ${meta.width} × ${meta.height} pixels, above the limit of ${maxPixelsInWords()}.`,
    );
  }
  // Read whole by their decoders, not in strips: held to their own pixel limit, and reduced one after the other.
  const kind =
    format === 'heif'
      ? 'HEIF/AVIF'
      : meta.isProgressive
        ? format === 'png'
          ? 'interlaced PNG'
          : 'progressive JPEG'
        : null;
  if (kind && meta.width * meta.height > mediaLimits.maxPixelsDecodedWhole) {
    throw new HttpError(
      422,
      'pixel_limit',
      `The image is ${meta.width} × ${meta.height} pixels. A ${kind} is decoded whole, so it is accepted up to ${maxPixelsInWords(mediaLimits.maxPixelsDecodedWhole)}; save it as a TIFF${format === 'heif' ? '' : format === 'png' ? ' or a PNG without interlacing' : ' or a baseline JPEG'} and upload that.`,
    );
  }
  // Decided here, before anything is written: CMYK is refused with its reason.
  const colour: ColourSource = colourSource(meta);
  const swap = (meta.orientation ?? 1) >= 5;
  const ext = format === 'heif' && meta.compression === 'av1' ? 'avif' : FORMATS[format];
  return {
    format: ext === 'avif' ? 'avif' : format,
    ext,
    width: swap ? meta.height : meta.width,
    height: swap ? meta.width : meta.height,
    colour,
    decodedWhole: kind !== null,
  };
}

/**
 * One decode serves every output: upright, read through the embedded ICC profile (or as sRGB),
 * reduced to the display size; the whole-photo working image is reduced from it exactly as
 * repalette() reduces it, so both give the same palette.
 */
async function decodeDisplay(input: ImageInput, colour: ColourSource, oneAtATime: boolean) {
  try {
    return await decodeForIngest(input, colour, oneAtATime);
  } catch {
    throw new HttpError(422, 'corrupt_image', 'The image is truncated or damaged and cannot be decoded.');
  }
}

/** SHA-256 of the bytes, or of a file read as a stream (never whole in memory). */
async function sha256Of(input: ImageInput) {
  const hash = createHash('sha256');
  if (typeof input === 'string') for await (const chunk of createReadStream(input)) hash.update(chunk as Buffer);
  else hash.update(input);
  return hash.digest('hex');
}

const fromRaw = (data: Buffer, width: number, height: number) => sharp(data, { raw: { width, height, channels: 3 } });

/**
 * The part of ingest that stays in the upload request, done before the caller opens its transaction: the checks
 * by content from the file's header (type, size, pixel limits, colour model: a file it cannot take is refused
 * with a 4xx before anything is written) and the SHA-256, hashed as the file streams from disk. Writes nothing,
 * except with object storage the upload's temp master (`stagedMaster`): a large master takes seconds to send, and
 * a transaction held open meanwhile sits idle on its connection (the socket timeout closes it), so it is sent here,
 * before the caller's transaction; storePhoto takes it from there, and left unused the reconciler removes it.
 * Everything that decodes pixels runs afterwards in the `ingest-photo` job (runIngest).
 */
export async function checkUpload(input: IngestSource) {
  const source: ImageInput = input.path ?? input.buffer;
  const bytes = input.path !== undefined ? (await stat(input.path)).size : input.buffer.length;
  const info = await probe(source, bytes);
  const sha256 = await sha256Of(source);
  let stagedMaster: string | null = null;
  if (input.path !== undefined && storage().kind !== 'local' && !(await exists(masterPath(sha256, info.ext)))) {
    const key = tempMasterPath(sha256, info.ext);
    try {
      await storage().put(key, { file: input.path, sha256 });
    } catch (err) {
      await storage()
        .delete(key)
        .catch(() => undefined);
      throw err;
    }
    stagedMaster = key;
  }
  return { bytes, info, sha256, stagedMaster };
}
export type CheckedUpload = Awaited<ReturnType<typeof checkUpload>>;

/**
 * Stores an upload in the caller's transaction: the master byte for byte by SHA-256 (an uploaded file is renamed,
 * not copied, to the master's temporary name and moved into place after the commit) and the photo row at stage
 * `queued`, with what the header told (format, size). The caller queues its ingest job in the same transaction
 * (enqueueIngest) or runs the steps itself (ingestPhoto). `files` removes what was written if the caller fails.
 */
export async function storePhoto({ actor, transaction, input }: ServiceCtx<IngestInput & { checked?: CheckedUpload }>) {
  const checked = input.checked ?? (await checkUpload(input));
  const { bytes, info, sha256 } = checked;
  const files = new WrittenFiles();
  try {
    // Store the master byte for byte; an identical file already stored is shared.
    const master = masterPath(sha256, info.ext);
    if (!(await exists(master))) {
      // Under a temporary name until the rows commit: a process killed before the commit leaves no master that no
      // row points at (the reconciler clears the temp file), and a rolled-back transaction never moves it into place.
      const tmp = checked.stagedMaster
        ? files.adopt(checked.stagedMaster)
        : input.path !== undefined
          ? await files.moveTemp(sha256, info.ext, input.path)
          : await files.writeTemp(sha256, info.ext, input.buffer);
      transaction.afterCommit(async () => {
        // A failed move must not turn a committed upload into an error; the reconciler finishes it later.
        await moveIntoPlace(tmp, master).catch((e) => console.error('[media] moving a master into place', e));
      });
    } else if (checked.stagedMaster) await storage().delete(checked.stagedMaster);
    const photo = await Photo.create(
      {
        pieceId: input.pieceId ?? null,
        trialId: input.trialId ?? null,
        sha256,
        format: info.format,
        bytes,
        width: info.width,
        height: info.height,
        view: input.view ?? 'recto',
        originalName: input.originalName?.slice(0, 255) ?? null,
        caption: null,
        capturedAt: null,
        exif: {},
        gps: null,
        derivatives: { master: { path: master, width: info.width, height: info.height } },
        referencePatch: null,
        correction: null,
        colour: null,
        ingestStage: 'queued',
        ingestError: null,
        createdById: actor?.id ?? null,
      },
      { transaction },
    );
    return { photo, files };
  } catch (err) {
    await files.removeAll();
    if (err instanceof HttpError) throw err;
    throw new HttpError(422, 'unprocessable_image', 'The image could not be processed.', {
      reason: err instanceof Error ? err.message : String(err),
    });
  }
}

/** A step that cannot succeed on another attempt (the photo or its master is gone); the job fails at once. */
export class IngestGone extends Error {}

type StepCtx = {
  photo: Photo;
  /** The caller's transaction (ingestPhoto), else each step writes in its own. */
  transaction?: Transaction;
  /** Handed from one step to the next within one run: the whole photo's working image, decoded while reading. */
  work?: RawImage & { scale: number };
  jobTag: string;
};

const inTransaction = <T>(ctx: StepCtx, fn: (t: Transaction) => Promise<T>) =>
  ctx.transaction ? fn(ctx.transaction) : sequelize.transaction(fn);

const masterOf = (photo: Photo) => {
  const master = photo.derivatives.master?.path;
  if (!master) throw new IngestGone(`Photo ${photo.id} has no master file recorded.`);
  // Inside the transaction that stored it (ingestPhoto), or just after a commit, the master is still under tmp/.
  return masterFileOnDisk(master, photo.sha256).catch(async () => {
    // Moved into place between the two looks: read it there. Otherwise no attempt will find it.
    if (await exists(master)) return masterFileOnDisk(master, photo.sha256);
    throw new IngestGone(`The master file of photo ${photo.id} is missing (sha256 ${photo.sha256}).`);
  });
};

/**
 * The work of each step (shared/schemas/ingest.ts INGEST_STEPS gives the order). Each can run again on the same
 * photo (a retry, a job whose worker died) and skips what the photo already has.
 */
const INGEST_WORK: Record<IngestStep, (ctx: StepCtx) => Promise<void>> = {
  /**
   * EXIF (GPS kept apart, on the row only), the colour-managed decode and the WebP derivatives, read from the
   * stored master (sharp and exifr read the file, never whole into memory). The derivatives are encoded on libvips'
   * threads and written under temp names, then the row. The whole-photo working image goes on to the palette.
   */
  async reading(ctx) {
    const { photo } = ctx;
    if (photo.derivatives.display) return;
    const file = await masterOf(photo);
    const info = await probe(file, photo.bytes);
    const decoding = decodeDisplay(file, info.colour, info.decodedWhole);
    decoding.catch(() => undefined);
    const { exif, gps, capturedAt } = await readExif(file);
    const { display: shown, work, facts } = await decoding;
    const data = Buffer.from(shown.data.buffer, shown.data.byteOffset, shown.data.byteLength);
    const d = { width: shown.width, height: shown.height };
    const [display, thumb] = await Promise.all([
      fromRaw(data, d.width, d.height).webp({ quality: 82, effort: 0 }).toBuffer({ resolveWithObject: true }),
      fromRaw(data, d.width, d.height)
        .resize({ width: DERIVATIVES.thumb, height: DERIVATIVES.thumb, fit: 'inside', withoutEnlargement: true })
        .webp({ quality: 80, effort: 0 })
        .toBuffer({ resolveWithObject: true }),
    ]);
    ctx.work = { ...work, scale: work.width / photo.width };
    const files = new WrittenFiles();
    const derivatives = { ...photo.derivatives };
    try {
      for (const [kind, out] of [
        ['display', display],
        ['thumb', thumb],
      ] as const) {
        const rel = derivativePath(photo.id, kind);
        await files.write(rel, out.data);
        derivatives[kind] = { path: rel, width: out.info.width, height: out.info.height };
      }
      await photo.update({ exif, gps, capturedAt, colour: facts, derivatives }, { transaction: ctx.transaction });
    } catch (err) {
      await files.removeAll();
      throw err;
    }
  },
  /**
   * The palettes: the whole photo's and, when regions were marked while it waited, theirs (repalette, with the
   * exclusions, reference patch and chart it honours), written in one transaction; the search change log rows go
   * with them (server/search/hooks.ts). A photo whose whole-photo palette is stored already keeps it.
   */
  async palette(ctx) {
    const { photo } = ctx;
    await inTransaction(ctx, async (transaction) => {
      const has = await PaletteColour.count({
        where: { photoId: photo.id, regionId: null, variant: 'raw' },
        transaction,
      });
      if (has) return;
      await repalette({ transaction, photo, scope: 'all', decoded: ctx.work });
    });
  },
  /** IIIF Image API 3 level-0 tiles (server/iiif/tiles.ts), built under a temporary name. */
  async tiles(ctx) {
    const { photo } = ctx;
    await buildTiles(photo.id, await masterOf(photo), ctx.jobTag);
    // Removed while its tiles were being built: take the tiles away too, so no orphan folder stays behind.
    if (!(await Photo.findByPk(photo.id, { transaction: ctx.transaction }))) {
      await storage().deletePrefix(`${tilesDir(photo.id)}/`);
      throw new IngestGone(`Photo ${photo.id} was removed while its tiles were built.`);
    }
  },
};

/**
 * Runs a stored photo's ingest: each step of INGEST_STEPS in order, the photo's stage set to the step before it
 * runs, then `done`. Called by the `ingest-photo` job (server/jobs/handlers/ingest-photo.ts), and by ingestPhoto()
 * inside its caller's transaction. Throws an HttpError for a file that cannot be read (its message in words).
 */
export async function runIngest(
  photo: Photo,
  opts: { transaction?: Transaction; progress?: (fraction: number) => Promise<void>; jobTag?: string } = {},
) {
  const ctx: StepCtx = { photo, transaction: opts.transaction, jobTag: opts.jobTag ?? randomBytes(4).toString('hex') };
  for (const [i, step] of INGEST_STEPS.entries()) {
    await photo.update({ ingestStage: step, ingestError: null }, { transaction: opts.transaction });
    await opts.progress?.(i / INGEST_STEPS.length);
    await INGEST_WORK[step](ctx);
  }
  await photo.update({ ingestStage: 'done', ingestError: null }, { transaction: opts.transaction });
  return photo;
}

/**
 * Stores a photo and runs its ingest at once in the caller's transaction, without a job: the factories, the
 * demo seed and the pipeline's own tests, which want the palette straight away. The same steps as the job. On a
 * failure every file written here is removed again and an HttpError is thrown.
 */
export async function ingestPhoto({
  actor,
  transaction,
  input,
}: ServiceCtx<IngestInput & { checked?: CheckedUpload }>) {
  const { photo, files } = await storePhoto({ actor, transaction, input });
  try {
    await runIngest(photo, { transaction });
    const palette = await PaletteColour.findAll({ where: { photoId: photo.id }, transaction });
    return { photo, palette };
  } catch (err) {
    await files.removeAll();
    await storage().deletePrefix(`${derivativesDir(photo.id)}/`);
    await storage().deletePrefix(`${tilesDir(photo.id)}/`);
    if (err instanceof HttpError) throw err;
    throw new HttpError(422, 'unprocessable_image', 'The image could not be processed.', {
      reason: err instanceof Error ? err.message : String(err),
    });
  }
}

/** Deletes a photo's derivatives and tiles, and its master unless another photo row shares it. */
export async function removePhotoFiles(photo: Photo, transaction?: Transaction) {
  await storage().deletePrefix(`${derivativesDir(photo.id)}/`);
  await storage().deletePrefix(`${tilesDir(photo.id)}/`);
  const others = await Photo.count({ where: { sha256: photo.sha256 }, transaction });
  const stillUsed = others - ((await Photo.findByPk(photo.id, { transaction })) ? 1 : 0);
  const master = photo.derivatives.master?.path;
  if (stillUsed <= 0 && master) await storage().delete(master);
}

/** The storage key of a photo's file (server/storage). */
export function photoKey(photo: Photo, kind: 'thumb' | 'display' | 'master'): string {
  const rel = photo.derivatives[kind]?.path;
  if (!rel) throw new HttpError(404, 'not_found', `This photo has no ${kind} file.`);
  return rel;
}

/** Absolute path of a photo's file with the local storage driver (tests read the files; null-safe only there). */
export function photoFile(photo: Photo, kind: 'thumb' | 'display' | 'master'): string {
  const file = storage().localPath(photoKey(photo, kind));
  if (!file) throw new Error('photoFile needs the local storage driver; use photoKey and server/storage');
  return file;
}
