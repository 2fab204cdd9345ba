import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import sharp, { type Metadata } from 'sharp';
import type { Transaction } from 'sequelize';
import { HttpError } from '../http/errors.ts';
import { PaletteColour, Photo } from '../models/index.ts';
import type { PhotoView } from '../models/catalogue.ts';
import { colourSource, decodeForIngest, type ColourSource, type ImageInput } from './decode.ts';
import { readExif } from './exif.ts';
import { exists, moveIntoPlace, tempMasterPath, WrittenFiles } from './files.ts';
import { extractPalette } from './palette.ts';
import { maxBytesInWords, maxPixelsInWords, mediaLimits } from './limits.ts';
import { paletteRows } from './rows.ts';
import { derivativePath, derivativesDir, masterPath, tilesDir } from './paths.ts';
import { storage } from '../storage/index.ts';
import type { ServiceCtx } from '../services/context.ts';
export { repalette } from './repalette.ts';

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
 * The work of ingest that needs no database, done before the caller opens its transaction: a large master takes
 * seconds to read, and a transaction held open meanwhile sits idle on its connection (the socket timeout,
 * DB_QUERY_TIMEOUT_MS, closed it under a 300 MB TIFF on a loaded machine). In this order: check → SHA-256 and EXIF
 * → decode → derivatives (encoded, in memory: small) → palette (the decode and the WebP encodes overlap with the
 * work on this thread). An upload on disk (`input.path`) is read from its file, never whole into memory (sharp,
 * exifr and the hash all read the file). Writes nothing, except with object storage the upload's temp master
 * (`stagedMaster`, below); throws an HttpError for a file it cannot take.
 */
export async function prepareIngest(input: IngestSource) {
  const source: ImageInput = input.path ?? input.buffer;
  const bytes = input.path !== undefined ? (await stat(input.path)).size : input.buffer.length;
  const info = await probe(source, bytes);
  // libvips decodes on its own threads while this thread hashes and reads EXIF.
  const decoding = decodeDisplay(source, info.colour, info.decodedWhole);
  decoding.catch(() => undefined);
  let stagedMaster: string | null = null;
  let sending: Promise<unknown> | null = null;
  try {
    // 1. The master's name is its SHA-256 (a file is hashed as it streams from disk); 2. EXIF (GPS kept apart, on
    // the row only), read from the file in chunks by exifr.
    const sha256 = await sha256Of(source);
    // With object storage, an upload on disk is sent to its temp master key now, beside the decode, rather than
    // inside the caller's transaction (a large master takes seconds to send, and an idle transaction's connection
    // is closed by the socket timeout). ingestPhoto takes it from there; left unused, the reconciler removes it.
    if (input.path !== undefined && storage().kind !== 'local' && !(await exists(masterPath(sha256, info.ext)))) {
      stagedMaster = tempMasterPath(sha256, info.ext);
      sending = storage().put(stagedMaster, { file: input.path, sha256 });
      sending.catch(() => undefined);
    }
    const { exif, gps, capturedAt } = await readExif(source);
    const { display: shown, work, facts } = await decoding;

    // 3. Derivatives (WebP at the fastest effort, no metadata: sharp writes none unless asked), encoded on libvips'
    // threads while 4. the palette of the whole photo is computed here on a working-size copy.
    const data = Buffer.from(shown.data.buffer, shown.data.byteOffset, shown.data.byteLength);
    const d = { width: shown.width, height: shown.height };
    const encoding = Promise.all([
      fromRaw(data, d.width, d.height).webp({ quality: 82, effort: 0 }).toBuffer({ resolveWithObject: true }),
      fromRaw(data, d.width, d.height)
        .resize({ width: DERIVATIVES.thumb, height: DERIVATIVES.thumb, fit: 'inside', withoutEnlargement: true })
        .webp({ quality: 80, effort: 0 })
        .toBuffer({ resolveWithObject: true }),
    ]);
    encoding.catch(() => undefined);
    const colours = extractPalette(work);
    const [display, thumb] = await encoding;
    await sending;
    return { bytes, info, sha256, exif, gps, capturedAt, facts, display, thumb, colours, stagedMaster };
  } catch (err) {
    if (stagedMaster) {
      const key = stagedMaster;
      await sending?.catch(() => undefined);
      await storage()
        .delete(key)
        .catch(() => undefined);
    }
    if (err instanceof HttpError) throw err;
    throw new HttpError(422, 'unprocessable_image', 'The image could not be processed.', {
      reason: err instanceof Error ? err.message : String(err),
    });
  }
}
export type PreparedIngest = Awaited<ReturnType<typeof prepareIngest>>;

/**
 * The media pipeline: prepareIngest() (unless the caller has done it before opening its transaction, `prepared`),
 * then, in the caller's transaction, store the master byte for byte by SHA-256 (an uploaded file is renamed, not
 * copied, to the master's temporary name, moved into place after the commit), the photo row, the derivative files
 * and the palette rows. On any failure every file written here is removed again and an HttpError is thrown.
 */
export async function ingestPhoto({
  actor,
  transaction,
  input,
}: ServiceCtx<IngestInput & { prepared?: PreparedIngest }>) {
  const prepared = input.prepared ?? (await prepareIngest(input));
  const { bytes, info, sha256, exif, gps, capturedAt, facts, display, thumb, colours } = prepared;
  const files = new WrittenFiles();
  let photoId: number | null = null;
  try {
    // Store the master byte for byte; an identical file already stored is shared.
    const master = masterPath(sha256, info.ext);
    if (!(await exists(master))) {
      // Under a temporary name until the rows commit: a process killed before the commit leaves no master that no
      // row points at (the reconciler clears the temp file), and a rolled-back transaction never moves it into place.
      const tmp = prepared.stagedMaster
        ? files.adopt(prepared.stagedMaster)
        : input.path !== undefined
          ? await files.moveTemp(sha256, info.ext, input.path)
          : await files.writeTemp(sha256, info.ext, input.buffer);
      transaction.afterCommit(async () => {
        // A failed move must not turn a committed upload into an error; the reconciler finishes it later.
        await moveIntoPlace(tmp, master).catch((e) => console.error('[media] moving a master into place', e));
      });
    } else if (prepared.stagedMaster) await storage().delete(prepared.stagedMaster);

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
        capturedAt,
        exif,
        gps,
        derivatives: { master: { path: master, width: info.width, height: info.height } },
        referencePatch: null,
        correction: null,
        colour: facts,
        createdById: actor?.id ?? null,
      },
      { transaction },
    );
    photoId = photo.id;

    const derivatives = { ...photo.derivatives };
    for (const [kind, out] of [
      ['display', display],
      ['thumb', thumb],
    ] as const) {
      const rel = derivativePath(photo.id, kind);
      await files.write(rel, out.data);
      derivatives[kind] = { path: rel, width: out.info.width, height: out.info.height };
    }
    await photo.update({ derivatives }, { transaction });
    const palette = await PaletteColour.bulkCreate(paletteRows(photo.id, null, 'raw', colours), { transaction });
    return { photo, palette };
  } catch (err) {
    await files.removeAll();
    if (photoId) await storage().deletePrefix(`${derivativesDir(photoId)}/`);
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
