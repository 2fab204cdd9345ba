import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import express from 'express';
import helmet from 'helmet';
import '../shared/messages.ts'; // zod speaks in people's words (details.fields of every 400)
import { ROOT_DIR, env, isProduction, isTest, publicUrl } from './env.ts';
import { contractCheck } from './http/contract.ts';
import { apiNotFound, errorHandler } from './http/errors.ts';
import { allowedHostnames, hostCheck } from './http/host-check.ts';
import { appOrigins, originCheck } from './http/origin-check.ts';
import { apiRouter } from './routes/index.ts';
import { iiifRouter } from './routes/iiif/index.ts';
import { mediaRouter } from './routes/media/index.ts';
import { sessionMiddleware } from './auth/session.ts';
import { passport } from './auth/passport.ts';
import { installSearchHooks } from './search/hooks.ts';
import { requestLogger } from './log/index.ts';
import { applyServerTimeouts } from './http/server-timeouts.ts';

export type AppOptions = {
  clientDir?: string;
  /** Overrides TRUST_PROXY (server/env.ts), for tests of the proxy setting. */
  trustProxy?: boolean | number | string;
  /** Host names allowed besides PUBLIC_URL's and ALLOWED_HOSTS (server/env.ts), for tests that serve other hosts. */
  allowedHosts?: string[];
};

/** The Express app, without listening: tests drive it with supertest. */
export function createApp(options: AppOptions = {}) {
  // Search indexes follow every write through model hooks; they load on first use (tests) or at start (server/index.ts).
  installSearchHooks();
  const app = express();
  app.disable('x-powered-by');
  // First: every request gets an id (X-Request-Id) and one JSON log line when it finishes.
  app.use(requestLogger());
  // Off unless configured (TRUST_PROXY): otherwise any client's X-Forwarded-For would pick its own req.ip.
  app.set('trust proxy', options.trustProxy ?? env.TRUST_PROXY);
  app.use(
    hostCheck(
      allowedHostnames({
        publicUrl,
        extra: [...env.ALLOWED_HOSTS, ...(options.allowedHosts ?? [])],
        production: isProduction,
      }),
    ),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          upgradeInsecureRequests: null,
        },
      },
      strictTransportSecurity: env.NODE_ENV === 'production',
    }),
  );
  app.use(express.json({ limit: '1mb' }));
  app.use(originCheck(appOrigins(publicUrl, isProduction)));

  app.use(sessionMiddleware());
  app.use(passport.initialize());
  app.use(passport.session());

  // In tests every JSON answer of an /api route is checked against its contract (server/openapi/groups/).
  if (isTest) app.use('/api', contractCheck());
  // The API reference: our page and initializer (server/openapi/docs/), then Swagger UI's files from swagger-ui-dist.
  app.use('/api/docs', express.static(path.join(ROOT_DIR, 'server/openapi/docs')));
  app.use(
    '/api/docs',
    express.static(path.dirname(createRequire(import.meta.url).resolve('swagger-ui-dist/package.json')), {
      index: false,
    }),
  );
  app.use('/api', apiRouter());
  app.use('/api', apiNotFound);
  app.use('/iiif', iiifRouter);
  app.use('/media', mediaRouter);

  app.use('/fonts', express.static(path.join(ROOT_DIR, 'fonts'), { immutable: true, maxAge: '30d' }));
  const clientDir = options.clientDir ?? path.join(ROOT_DIR, 'dist/client');
  if (existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }
  app.use(errorHandler);
  // The server that app.listen() creates (server/index.ts, tests/support/server.ts) gets its keep-alive timeouts here.
  const listen = app.listen.bind(app);
  app.listen = ((...args: Parameters<typeof listen>) => applyServerTimeouts(listen(...args))) as typeof app.listen;
  return app;
}
