import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import type { PieceListResponse } from '../../../shared/schemas/piece.ts';
import { searchEngine } from '../../search/engine.ts';

/**
 * The archive list's answers, cached per audience and query while nothing that could change them has been written
 * (issue 16, point 9: the list page at 200 connections). A page is one statement in MariaDB, but at 200 connections
 * the same few pages (the first page of each sort order) are asked for over and over, and the database round trip,
 * the rows' parsing and their presentation were most of the list's cost.
 *
 * Validity comes from the search change log, not from a time to live: every write that affects a piece (its fields,
 * publication, deletion and restore) or its photos appends to the log in its own transaction (search/hooks.ts), and
 * `searchEngine.logMark()` catches up with the log after the request arrived and answers how many log rows have been
 * read. An answer is served from the cache only when it was read from MariaDB under the same count: so a request sees
 * every write committed before it, on any app server, exactly as search does. When the indexes are not loaded yet or
 * the catch-up fails, the list is read from MariaDB uncached. Concurrent misses of one key share one read.
 * Each server holds its own cache; nothing in it is needed by another server.
 *
 * An answer is kept serialised, with its entity tag, so a hit costs no JSON.stringify and no hashing of the body
 * (together about 5 % of the process's time at 200 connections, and much of its garbage).
 */
export type SerialisedAnswer = { json: string; etag: string };
type Entry = { mark: number; answer: Promise<SerialisedAnswer> };

const cache = new LRUCache<string, Entry>({ max: 2_000 });

/** `audience` names what the actor may see (drafts or not); `query` is the parsed query, in its schema's key order. */
export async function cachedList(
  audience: string,
  query: object,
  read: () => Promise<PieceListResponse>,
): Promise<SerialisedAnswer> {
  const mark = await searchEngine.logMark();
  if (mark === null) return serialise(await read());
  const key = `${audience}\u0000${JSON.stringify(query)}`;
  const hit = cache.get(key);
  if (hit && hit.mark === mark) return hit.answer;
  const answer = read().then(serialise);
  if (!hit || hit.mark < mark) {
    cache.set(key, { mark, answer });
    answer.catch(() => {
      if (cache.get(key)?.answer === answer) cache.delete(key);
    });
  }
  return answer;
}

/** The body as Express would send it, and a weak entity tag of the same form as Express's default (length and SHA-1). */
function serialise(value: PieceListResponse): SerialisedAnswer {
  const json = JSON.stringify(value);
  const hash = createHash('sha1').update(json, 'utf8').digest('base64').slice(0, 27);
  return { json, etag: `W/"${Buffer.byteLength(json, 'utf8').toString(16)}-${hash}"` };
}

/** Forget every cached answer (tests). */
export function clearListCache() {
  cache.clear();
}
