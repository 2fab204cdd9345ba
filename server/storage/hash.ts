import { createHash } from 'node:crypto';
import { Transform } from 'node:stream';

/** A pass-through stream that counts the bytes and computes their SHA-256 as they flow. */
export function hashingStream() {
  const hash = createHash('sha256');
  let bytes = 0;
  const stream = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      bytes += chunk.length;
      done(null, chunk);
    },
  });
  return { stream, result: () => ({ bytes, sha256: hash.digest('hex') }) };
}

export const sha256OfBuffer = (data: Buffer) => createHash('sha256').update(data).digest('hex');
