import type { AuditEventOut, PieceOut, PieceSummary } from '../../shared/schemas/piece.ts';
import type { AuditEvent, Piece, User } from '../models/index.ts';
import { abilities, can, type Actor } from '../policies/index.ts';

const PIECE_ACTIONS = [
  'piece:update',
  'piece:publish',
  'piece:delete',
  'piece:restore',
  'piece:history',
  'photo:create',
] as const;

export const pieceRecord = (p: Piece) => ({ status: p.status, deleted: p.deletedAt != null });

export function presentPiece(p: Piece, actor: Actor): PieceOut {
  return {
    id: p.id,
    accessionNumber: p.accessionNumber,
    objectName: p.objectName,
    title: p.title,
    dateText: p.dateText,
    dateEdtf: p.dateEdtf,
    earliestYear: p.earliestYear,
    latestYear: p.latestYear,
    place: p.place,
    fibres: p.fibres,
    weave: p.weave,
    threadCount: p.threadCount,
    heightMm: p.heightMm,
    widthMm: p.widthMm,
    repeatMm: p.repeatMm,
    techniques: p.techniques,
    dyestuffs: p.dyestuffs,
    historicalMordants: p.historicalMordants,
    description: p.description,
    provenance: p.provenance,
    condition: p.condition,
    creditLine: p.creditLine,
    status: p.status,
    makers: p.makers ?? [],
    patternName: p.patternName ?? null,
    marks: p.marks ?? [],
    ...(can(actor, 'piece:see-storage') ? { storageLocation: p.storageLocation ?? null } : {}),
    objectRights: p.objectRights ?? null,
    imageRights: p.imageRights ?? null,
    deletedAt: p.deletedAt ? p.deletedAt.toISOString() : null,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    abilities: abilities(actor, PIECE_ACTIONS, pieceRecord(p)),
  };
}

/** The row in the archive table and grid: the fields worth sorting by, plus the first photo's thumbnail. */
export function presentPieceRow(p: Piece, thumbPhotoId: number | null): PieceSummary {
  return {
    id: p.id,
    accessionNumber: p.accessionNumber,
    objectName: p.objectName,
    title: p.title,
    dateText: p.dateText,
    earliestYear: p.earliestYear,
    latestYear: p.latestYear,
    fibres: p.fibres,
    techniques: p.techniques,
    status: p.status,
    deletedAt: p.deletedAt ? p.deletedAt.toISOString() : null,
    updatedAt: p.updatedAt.toISOString(),
    thumbUrl: thumbPhotoId ? `/media/photos/${thumbPhotoId}/thumb` : null,
  };
}

export function presentAuditEvent(e: AuditEvent & { actor?: User | null }): AuditEventOut {
  return {
    id: e.id,
    action: e.action,
    at: e.createdAt.toISOString(),
    actor: e.actor ? { id: e.actor.id, name: e.actor.name } : null,
    fields: e.changes ? Object.keys(e.changes) : [],
    changes: e.changes ?? {},
  };
}
