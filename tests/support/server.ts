import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { ROOT_DIR } from '../../server/env.ts';
import { createApp } from '../../server/app.ts';
import { childEnv } from './env.ts';

/** Start the real app on a free loopback port for browser tests. */
export async function startServer(): Promise<{ url: string; close: () => Promise<void> }> {
  const app = createApp();
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** A free loopback port (free when asked; the caller binds it soon after). */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export type ServerProcess = { url: string; port: number; child: ChildProcess; stop: () => Promise<void> };

/**
 * Start a separate app server process (dist/server/index.mjs, built from server/index.ts, as `npm start` runs it) on the given port, against the same
 * database and data directory as the tests. Resolves once it is serving with its search indexes loaded; stop() sends
 * SIGTERM and waits.
 */
export async function startServerProcess(
  port: number,
  timeoutMs = 90_000,
  extraEnv: Record<string, string> = {},
  { waitForSearch = true }: { waitForSearch?: boolean } = {},
): Promise<ServerProcess> {
  // The bundled server that `npm start` runs (scripts/lib.sh build_server; npm test and npm run bench build it first).
  const child = spawn(process.execPath, ['--enable-source-maps', 'dist/server/index.mjs'], {
    cwd: ROOT_DIR,
    // The tests name each client by X-Forwarded-For from loopback, as a proxy would (TRUST_PROXY is off by default).
    env: childEnv({
      PORT: String(port),
      HOST: '127.0.0.1',
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      TRUST_PROXY: 'loopback',
      ...extraEnv,
    }),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`server on port ${port} did not start in ${timeoutMs} ms:\n${output}`));
    }, timeoutMs);
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (output.includes('[tinctoria] serving at')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server on port ${port} exited with ${code}:\n${output}`));
    });
  });
  // The server listens before its search indexes are in (search answers 503 until then): wait for them too.
  for (const until = Date.now() + timeoutMs; waitForSearch;) {
    const h = await fetch(`http://127.0.0.1:${port}/api/health`)
      .then((r) => r.json() as Promise<{ search?: { text: { loaded: boolean }; shade: { loaded: boolean } } }>)
      .catch(() => null);
    if (h?.search?.text.loaded && h.search.shade.loaded) break;
    if (Date.now() > until) {
      child.kill('SIGKILL');
      throw new Error(`server on port ${port} did not load its search indexes in ${timeoutMs} ms:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  const exited = new Promise<void>((resolve) => {
    if (child.exitCode !== null) resolve();
    else child.once('exit', () => resolve());
  });
  return {
    url: `http://127.0.0.1:${port}`,
    port,
    child,
    stop: async () => {
      if (child.exitCode === null) child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    },
  };
}
