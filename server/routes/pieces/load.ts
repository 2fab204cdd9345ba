import { IndexHints, Op, QueryTypes, Sequelize, type WhereOptions } from 'sequelize';
import { accessionKey } from '../../../shared/accession.ts';
import type { PieceListQuery } from '../../../shared/schemas/piece.ts';
import { notFound } from '../../http/errors.ts';
import { PaletteColour, Photo, Piece, Region, sequelize } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { foldCountsIfMany, pieceDeltasSql, pieceTotal, pieceTotalSql } from './counts.ts';

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

// What presentPieceRow() shows (server/presenters/piece.ts), not the long texts and JSON of the whole record.
const LIST_ATTRIBUTES = [
  'id',
  'accessionNumber',
  'objectName',
  'title',
  'dateText',
  'earliestYear',
  'latestYear',
  'fibres',
  'techniques',
  'status',
  'deletedAt',
  'updatedAt',
] as const;

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
  if (q.deleted !== 'only') and.push({ deletedAt: null });
  // Without text or facet filters the total comes from piece_counts (migration 0025), not a COUNT(*) over the table.
  const filtered = Boolean(q.q || q.fibre || q.technique || q.dyestuff);
  const statuses = !can(actor, 'piece:list-drafts') ? ['published'] : q.status ? [q.status] : null;
  const deleted = q.deleted === 'only';
  // Accession numbers sort naturally (1931.4.9 before 1931.4.12) by their stored sort key, the search's order too.
  const column = q.sort === 'accessionNumber' ? 'accessionSort' : q.sort;
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  // One statement per page: the page's ids from the sort order's own index (migration 0025: it ends in id, status,
  // deletedAt, so an OFFSET skips index entries, not rows, and no filesort), then those rows with the columns the list
  // shows, each one's first photo, and the total from piece_counts. Filtered lists count apart (a scan either way).
  const ids = queryGenerator()
    .selectQuery(
      'pieces',
      {
        attributes: ['id'],
        where: { [Op.and]: and },
        tableAs: 'Piece',
        order: [
          [column, dir],
          ['id', 'ASC'],
        ],
        limit: q.pageSize,
        offset: (q.page - 1) * q.pageSize,
        // The optimizer otherwise takes the (status, deletedAt) index and sorts every visible row for a deep page.
        indexHints: filtered
          ? []
          : [{ type: IndexHints.FORCE, values: [`pieces_list_${column}${dir === 'DESC' ? '_desc' : ''}`] }],
      },
      Piece,
    )
    .replace(/;\s*$/, '');
  const col = (c: string) => `p.${sequelize.getQueryInterface().quoteIdentifier(c)}`;
  const [rows, counted] = await Promise.all([
    sequelize.query<Piece>(
      `SELECT ${LIST_ATTRIBUTES.map(col).join(', ')},
        (SELECT MIN(ph.id) FROM photos ph WHERE ph.pieceId = p.id) AS thumbPhotoId
        ${filtered ? '' : `, ${pieceTotalSql(statuses, deleted)} AS total, ${pieceDeltasSql} AS deltas`}
      FROM (${ids}) AS page JOIN pieces AS p ON p.id = page.id
      ORDER BY ${col(column)} ${dir}, p.id ASC`,
      { model: Piece, mapToModel: true, type: QueryTypes.SELECT },
    ),
    filtered ? Piece.count({ where: { [Op.and]: and }, paranoid: false }) : null,
  ]);
  const firstPhoto = new Map<number, number>();
  for (const p of rows) {
    const thumb = p.get('thumbPhotoId') as number | null;
    if (thumb != null) firstPhoto.set(p.id, Number(thumb));
  }
  let total = counted;
  if (total === null) {
    // Past the last page there is no row to carry the total.
    if (!rows.length) total = await pieceTotal(statuses, deleted);
    else {
      total = Number(rows[0].get('total') ?? 0);
      foldCountsIfMany(Number(rows[0].get('deltas')));
    }
  }
  return { rows, total, firstPhoto };
}

type QueryGenerator = { selectQuery: (table: string, options: object, model: typeof Piece) => string };
// Sequelize's own SELECT builder (the one findAll uses), for a subquery: its where, order and index hints as findAll
// would write them. Not in Sequelize's type definitions.
const queryGenerator = () =>
  (sequelize.getQueryInterface() as unknown as { queryGenerator: QueryGenerator }).queryGenerator;

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
