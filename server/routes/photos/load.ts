import { notFound } from '../../http/errors.ts';
import { Photo, Piece } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';

/** A photo the actor may see (through its piece, or its trial), with that piece; otherwise 404. */
export async function loadReadablePhoto(actor: Actor, id: number) {
  const photo = await Photo.findByPk(id);
  if (!photo) throw notFound('Photo');
  if (photo.pieceId != null) {
    const piece = await Piece.findByPk(photo.pieceId, { paranoid: false });
    if (!piece || !can(actor, 'piece:read', pieceRecord(piece))) throw notFound('Photo');
    return { photo, piece };
  }
  if (!can(actor, 'trial:read')) throw notFound('Photo');
  return { photo, piece: null };
}

/** Changes are made on photos of live pieces only. */
export async function loadWritablePhoto(actor: Actor, id: number) {
  const loaded = await loadReadablePhoto(actor, id);
  if (loaded.piece?.deletedAt) throw notFound('Photo');
  return loaded;
}
