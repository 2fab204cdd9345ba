import type { Writable } from 'node:stream';
import { csvStringifier } from './csv.ts';
import type { ShadeQuery } from '../../shared/schemas/search.ts';
import type { Actor } from '../policies/index.ts';
import { runShade } from '../search/service.ts';

const COLUMNS = [
  'rank',
  'pieceAccessionNumber',
  'pieceTitle',
  'photoId',
  'hex',
  'L',
  'a',
  'b',
  'share',
  'source',
  'illuminant',
  'observer',
  'deltaE00',
  'queryHex',
  'queryL',
  'queryA',
  'queryB',
  'maxDeltaE',
] as const;
const PAGE = 200;

/**
 * Shade-search results as CSV, ranked as on the search page. With `page` or `limit` in the query
 * only that page is written; otherwise every matching piece, fetched a page of 200 at a time.
 */
export async function writeShadeCsv(out: Writable, actor: Actor, input: ShadeQuery, onePage: boolean) {
  const csv = csvStringifier({ header: true, columns: [...COLUMNS] });
  csv.pipe(out);
  let rank = onePage ? (input.page - 1) * input.limit : 0;
  for (let page = onePage ? input.page : 1; ; page++) {
    const res = await runShade({ actor, input: onePage ? input : { ...input, page, limit: PAGE } });
    for (const it of res.items) {
      csv.write({
        rank: ++rank,
        pieceAccessionNumber: it.accessionNumber,
        pieceTitle: it.title,
        photoId: it.photoId,
        hex: it.colour.hex,
        L: it.colour.lab.L.toFixed(2),
        a: it.colour.lab.a.toFixed(2),
        b: it.colour.lab.b.toFixed(2),
        share: it.colour.share.toFixed(4),
        source: it.colour.source,
        illuminant: it.colour.illuminant,
        observer: `${it.colour.observer}°`,
        deltaE00: it.deltaE00.toFixed(3),
        queryHex: res.query.hex,
        queryL: res.query.L.toFixed(2),
        queryA: res.query.a.toFixed(2),
        queryB: res.query.b.toFixed(2),
        maxDeltaE: res.query.maxDeltaE,
      });
    }
    if (onePage || !res.items.length || page * PAGE >= res.total) break;
  }
  csv.end();
  await new Promise((resolve, reject) => out.on('finish', resolve).on('error', reject));
}
