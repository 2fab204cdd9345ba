import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { Request, Response } from 'express';
import type { HttpError } from '../http/errors.ts';
import { LocalStorage, storage, StorageNotFound } from './index.ts';
import type { ByteRange } from './types.ts';

/** One satisfiable byte range of a Range header ("bytes=a-b", "bytes=a-", "bytes=-n"), else null (whole body). */
function parseRange(header: string | undefined, size: number): ByteRange | 'unsatisfiable' | null {
  const m = header ? /^bytes=(\d*)-(\d*)$/.exec(header.trim()) : null;
  if (!m || (m[1] === '' && m[2] === '')) return null;
  let start: number;
  let end: number;
  if (m[1] === '') {
    start = Math.max(0, size - Number(m[2]));
    end = size - 1;
  } else {
    start = Number(m[1]);
    end = m[2] === '' ? size - 1 : Math.min(Number(m[2]), size - 1);
  }
  return start > end || start >= size ? 'unsatisfiable' : { start, end };
}

/**
 * Sends a stored object as the response body, after the route has checked who may read it. The local driver hands
 * the file to Express's sendFile (ranges, Last-Modified, conditional GETs); object storage is streamed through this
 * server with its type, length, Last-Modified and a single byte range when asked. Headers the route set stay.
 */
export async function sendStored(req: Request, res: Response, key: string, missing: () => HttpError) {
  const store = storage();
  if (store instanceof LocalStorage) {
    store.localPath(key); // checks the key
    // Relative to the store's root, so a dot-folder above it (such as .data/) is not mistaken for a dotfile.
    await new Promise<void>((resolve, reject) =>
      res.sendFile(key, { root: store.root, dotfiles: 'deny' }, (err) =>
        err && !res.headersSent ? reject(missing()) : resolve(),
      ),
    );
    return;
  }
  const meta = await store.stat(key);
  if (!meta) throw missing();
  if (!res.get('Content-Type')) res.type(path.extname(key) || 'application/octet-stream');
  res.set('Last-Modified', meta.modifiedAt.toUTCString());
  res.set('Accept-Ranges', 'bytes');
  const since = req.get('If-Modified-Since');
  if (since && !req.get('Range') && Math.floor(meta.modifiedAt.getTime() / 1000) <= Date.parse(since) / 1000) {
    res.status(304).end();
    return;
  }
  const range = parseRange(req.get('Range'), meta.bytes);
  if (range === 'unsatisfiable') {
    res.status(416).set('Content-Range', `bytes */${meta.bytes}`).end();
    return;
  }
  if (range) {
    res.status(206).set('Content-Range', `bytes ${range.start}-${range.end}/${meta.bytes}`);
    res.set('Content-Length', String(range.end - range.start + 1));
  } else res.set('Content-Length', String(meta.bytes));
  if (req.method === 'HEAD') {
    res.end();
    return;
  }
  // Removed between the stat and the read (another server deleted the photo): still a 404, not a 500.
  const body = await store.get(key, range ?? undefined).catch((err: unknown) => {
    throw err instanceof StorageNotFound ? missing() : err;
  });
  await pipeline(body, res).catch(() => res.destroy());
}
