import { createServer, request, type Server } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fairTurn, fairTurnBacklog } from '../../server/http/fair-turns.ts';

// server/http/fair-turns.ts: work released all at once (many searches waiting on one catch-up with the change log)
// takes turns, so that the process still reads new requests in between. Checked by order of events, never by time.
let server: Server;
let port = 0;

beforeAll(async () => {
  server = createServer((_req, res) => res.end('ok'));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  port = (server.address() as { port: number }).port;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

const busy = (ms: number) => {
  for (const end = performance.now() + ms; performance.now() < end;);
};

describe('fair turns', () => {
  it('lets 100 released handlers run in arrival order, and answers an HTTP request while they are still running', async () => {
    const order: number[] = [];
    let answeredAfter = -1;
    let release!: () => void;
    const gate = new Promise<void>((resolve) => {
      release = resolve;
    });
    // The first handler sends a request to a server in this same process: to be answered, it needs the event loop's
    // poll phase twice (the server reads it, the client reads the answer).
    let answered!: Promise<void>;
    const ask = () =>
      new Promise<void>((resolve, reject) => {
        const req = request({ host: '127.0.0.1', port, path: '/', agent: false }, (res) => {
          res.resume();
          res.on('end', () => {
            answeredAfter = order.length;
            resolve();
          });
        });
        req.on('error', reject);
        req.end();
      });
    const handlers = Array.from({ length: 100 }, async (_x, i) => {
      await gate;
      await fairTurn();
      if (i === 0) answered = ask();
      busy(2);
      order.push(i);
    });
    release();
    await Promise.all(handlers);
    await answered;
    expect(order).toEqual(Array.from({ length: 100 }, (_x, i) => i));
    // 100 × 2 ms of work in one go would have answered the request only after the last handler.
    expect(answeredAfter).toBeGreaterThanOrEqual(0);
    expect(answeredAfter).toBeLessThan(100);
    expect(fairTurnBacklog()).toBe(0);
  });

  it('runs at once when the loop is not busy', async () => {
    let ran = false;
    const p = fairTurn().then(() => {
      ran = true;
    });
    await p;
    expect(ran).toBe(true);
    expect(fairTurnBacklog()).toBe(0);
  });
});
