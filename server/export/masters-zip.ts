import type { Writable } from 'node:stream';
import path from 'node:path';
import yazl from 'yazl';
import type { Photo, Piece } from '../models/index.ts';
import { findMaster } from '../iiif/files.ts';
import { storage } from '../storage/index.ts';

/**
 * A hand-over ZIP of a piece's master files, untouched, with their recorded SHA-256
 * values in manifest-sha256.txt (the `sha256sum -c` format, as BagIt manifests use)
 * and a manifest.json naming each photo. A master missing on disk is listed, not hidden.
 * Masters are the camera's bytes, EXIF GPS included, and are not rewritten (their SHA-256 must hold): a master
 * the reader may not download (`mayTake`, the policy's photo:master — GPS is for curators and admins) is left
 * out and listed in manifest.json with `withheld` saying why. Works on either storage driver (server/storage).
 */
export async function writeMastersZip(
  out: Writable,
  piece: Piece,
  photos: Photo[],
  mayTake: (photo: Photo) => boolean = () => true,
) {
  const zip = new yazl.ZipFile();
  zip.outputStream.pipe(out);
  const lines: string[] = [];
  const files: Array<{
    photoId: number;
    view: string;
    file: string | null;
    sha256: string;
    bytes: number;
    originalName: string | null;
    missing?: true;
    withheld?: string;
  }> = [];
  for (const photo of photos) {
    if (!mayTake(photo)) {
      files.push({
        photoId: photo.id,
        view: photo.view,
        file: null,
        sha256: photo.sha256,
        bytes: Number(photo.bytes),
        originalName: photo.originalName,
        withheld: 'The master holds a GPS location, which only curators and administrators may download.',
      });
      continue;
    }
    const master = await findMaster(photo);
    const name = master ? `masters/${photo.id}-${photo.view}${path.extname(master)}` : null;
    if (master && name) {
      // Stored, not deflated: masters are already compressed images and must come out byte for byte. Each master is
      // streamed from storage only when the ZIP reaches it (one open read at a time, never held in memory).
      const size = (await storage().stat(master))?.bytes;
      zip.addReadStreamLazy(name, { compress: false, ...(size != null ? { size } : {}) }, (cb) =>
        storage()
          .get(master)
          .then(
            (stream) => cb(null, stream),
            (err: Error) => cb(err, undefined as never),
          ),
      );
      lines.push(`${photo.sha256}  ${name}`);
      files.push({
        photoId: photo.id,
        view: photo.view,
        file: name,
        sha256: photo.sha256,
        bytes: Number(photo.bytes),
        originalName: photo.originalName,
      });
    } else {
      files.push({
        photoId: photo.id,
        view: photo.view,
        file: null,
        sha256: photo.sha256,
        bytes: Number(photo.bytes),
        originalName: photo.originalName,
        missing: true,
      });
    }
  }
  zip.addBuffer(Buffer.from(lines.map((l) => `${l}\n`).join('')), 'manifest-sha256.txt');
  const manifest = {
    accessionNumber: piece.accessionNumber,
    title: piece.title,
    algorithm: 'SHA-256',
    createdAt: new Date().toISOString(),
    files,
  };
  zip.addBuffer(Buffer.from(JSON.stringify(manifest, null, 2)), 'manifest.json');
  zip.end();
  await new Promise((resolve, reject) => out.on('finish', resolve).on('error', reject));
}
