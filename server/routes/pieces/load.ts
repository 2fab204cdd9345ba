import { Op, Sequelize, type WhereOptions } from 'sequelize';
import { accessionKey } from '../../../shared/accession.ts';
import type { PieceListQuery } from '../../../shared/schemas/piece.ts';
import { notFound } from '../../http/errors.ts';
import { PaletteColour, Photo, Piece, Region, sequelize } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';

/** A piece the actor may read, deleted ones included for those allowed; otherwise 404. */
export async function loadReadablePiece(actor: Actor, id: number) {
  const piece = await Piece.findByPk(id, { paranoid: false });
  if (!piece || !can(actor, 'piece:read', pieceRecord(piece))) throw notFound('Piece');
  return piece;
}

const jsonHas = (column: string, value: string) =>
  Sequelize.literal(`JSON_CONTAINS(\`Piece\`.\`${column}\`, ${sequelize.escape(JSON.stringify(value))})`);
const jsonNameHas = (column: string, value: string) =>
  Sequelize.literal(
    `JSON_SEARCH(\`Piece\`.\`${column}\`, 'one', ${sequelize.escape(value)}, NULL, '$[*].name') IS NOT NULL`,
  );

export async function listPieces(actor: Actor, q: PieceListQuery) {
  const and: WhereOptions[] = [];
  if (!can(actor, 'piece:list-drafts')) and.push({ status: 'published' });
  else if (q.status) and.push({ status: q.status });
  if (q.deleted === 'only') and.push({ deletedAt: { [Op.ne]: null } });
  if (q.fibre) and.push(jsonHas('fibres', q.fibre));
  if (q.technique) and.push(jsonHas('techniques', q.technique));
  if (q.dyestuff) and.push(jsonNameHas('dyestuffs', q.dyestuff));
  if (q.q) {
    const escape = (t: string) => t.replace(/[\\%_]/g, (c) => `\\${c}`);
    const like = `%${escape(q.q)}%`;
    // "ex2021/1" finds EX 2021/1: accession numbers are also matched without case and spaces.
    const key = `%${escape(accessionKey(q.q))}%`;
    and.push({
      [Op.or]: [
        { accessionNumber: { [Op.like]: like } },
        { accessionKey: { [Op.like]: key } },
        { title: { [Op.like]: like } },
      ],
    });
  }
  const { rows, count } = await Piece.findAndCountAll({
    where: { [Op.and]: and },
    // Accession numbers sort naturally (1931.4.9 before 1931.4.12) by their stored sort key, the search's order too.
    order: [
      q.sort === 'accessionNumber' ? ['accessionSort', q.dir.toUpperCase()] : [q.sort, q.dir.toUpperCase()],
      ['id', 'ASC'],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
    paranoid: q.deleted !== 'only',
  });
  const firstPhoto = new Map<number, number>();
  if (rows.length) {
    const photos = await Photo.findAll({
      where: { pieceId: rows.map((p) => p.id) },
      attributes: ['id', 'pieceId'],
      order: [['id', 'ASC']],
    });
    for (const ph of photos) if (ph.pieceId != null && !firstPhoto.has(ph.pieceId)) firstPhoto.set(ph.pieceId, ph.id);
  }
  return { rows, total: count, firstPhoto };
}

export async function loadPhotosOf(pieceId: number) {
  const photos = await Photo.findAll({ where: { pieceId }, order: [['id', 'ASC']] });
  const ids = photos.map((p) => p.id);
  const [palette, regions] = ids.length
    ? await Promise.all([
        PaletteColour.findAll({ where: { photoId: ids } }),
        Region.findAll({ where: { photoId: ids }, order: [['id', 'ASC']] }),
      ])
    : [[], []];
  return photos.map((photo) => ({
    photo,
    palette: palette.filter((c) => c.photoId === photo.id),
    regions: regions.filter((r) => r.photoId === photo.id),
  }));
}
