import type { Request } from 'express';
import { Photo, Piece } from '../models/index.ts';
import { can, type Actor } from '../policies/index.ts';
import { notFound } from '../http/errors.ts';

/** This server's own origin as the client reached it (behind a proxy: trust proxy + forwarded headers). */
export const baseUrl = (req: Request) => `${req.protocol}://${req.get('host')}`;

export const pieceRecord = (piece: Piece) => ({ status: piece.status, deleted: piece.deletedAt != null });

/** The piece, or 404 when it is missing or the actor may not read it (visitors: published only). */
export async function readablePiece(actor: Actor, pieceId: number) {
  const piece = Number.isSafeInteger(pieceId) ? await Piece.findByPk(pieceId, { paranoid: false }) : null;
  if (!piece || !can(actor, 'piece:read', pieceRecord(piece))) throw notFound('Piece');
  return piece;
}

/** A photo follows its piece (or trial) for reading; a photo of neither is for signed-in users only. */
export async function readablePhoto(actor: Actor, photoId: number) {
  const photo = Number.isSafeInteger(photoId) ? await Photo.findByPk(photoId) : null;
  if (!photo) throw notFound('Photo');
  if (photo.pieceId != null) {
    const piece = await Piece.findByPk(photo.pieceId, { paranoid: false });
    if (!piece || !can(actor, 'piece:read', pieceRecord(piece))) throw notFound('Photo');
  } else if (photo.trialId != null ? !can(actor, 'trial:read') : actor === null) {
    throw notFound('Photo');
  }
  return photo;
}
