import type { Server } from 'node:http';
import { env } from '../env.ts';

/**
 * Timeouts of the HTTP server that serves the app (issue 16, point 7).
 *
 * Node closes a keep-alive connection once it has been idle for `keepAliveTimeout` (5 s by default). Under load that
 * timer runs out on connections that are not idle at all: their next request already waits in the socket, unread,
 * while the event loop works through the other connections' requests (timers run before sockets are read in each
 * turn of the loop). The connection is closed under the client's request, the client connects again, and the new
 * connection waits in the kernel's accept queue behind the busy loop. Measured with 200 connections on the search
 * route (full-size bench data, shared 2-core machine): clients saw first requests of 22 s and autocannon 10 s
 * timeouts while the server's own log showed no request slower than 0.12 s, and `ss` showed connections waiting
 * unaccepted in the listen queue for over 7 s: the time was spent before the app ever saw the request.
 *
 * So an idle connection is kept for 65 s, longer than the usual 60 s idle timeout of a reverse proxy or load balancer
 * in front (common practice: the app must not close a connection the proxy still considers open), and the headers
 * timeout is longer than that, as Node requires.
 *
 * A whole request may take HTTP_REQUEST_TIMEOUT_MS to arrive (Node's default of 5 minutes cut off a 2 GB master sent
 * over a slow line; the headers must still arrive within the headers timeout).
 */
export const KEEP_ALIVE_TIMEOUT_MS = 65_000;

export function applyServerTimeouts<S extends Server>(server: S): S {
  server.keepAliveTimeout = KEEP_ALIVE_TIMEOUT_MS;
  server.headersTimeout = KEEP_ALIVE_TIMEOUT_MS + 1_000;
  server.requestTimeout = env.HTTP_REQUEST_TIMEOUT_MS;
  return server;
}
