import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { logLevel } from '../env.ts';

/** The one logger of the server: JSON lines on stdout (request, job and search logs). Level from LOG_LEVEL. */
export const logger = pino({ level: logLevel, base: { app: 'tinctoria' } });

/** An incoming X-Request-Id is kept only when it is a short token of safe characters (no log or header injection). */
const SAFE_ID = /^[A-Za-z0-9._:-]{1,64}$/;
export const requestIdFrom = (header: string | string[] | undefined) =>
  typeof header === 'string' && SAFE_ID.test(header) ? header : randomUUID();

/** Query parameters whose values never reach a log line. */
const SECRET_PARAMS = /^(token|code|password|secret|key|signature|sig|access_token|api_key)$/i;
export function redactUrl(url: string | undefined): string {
  if (!url) return '';
  const q = url.indexOf('?');
  if (q < 0) return url;
  const params = new URLSearchParams(url.slice(q + 1));
  for (const k of new Set(params.keys())) if (SECRET_PARAMS.test(k)) params.set(k, '[redacted]');
  const rest = params.toString();
  return rest ? `${url.slice(0, q)}?${rest}` : url.slice(0, q);
}

type WithUser = IncomingMessage & { user?: { id?: number } };

/** One JSON line per request: method, url (secrets redacted), status, time, request id, user id when signed in. */
export const requestLogger = (log: Logger = logger) =>
  pinoHttp({
    logger: log,
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const id = requestIdFrom(req.headers['x-request-id']);
      res.setHeader('X-Request-Id', id);
      return id;
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
    // The route handlers log nothing by themselves; the line is written when the response finishes.
    serializers: {
      req: (req: { id: unknown; method: string; url: string }) => ({
        id: req.id,
        method: req.method,
        url: redactUrl(req.url),
      }),
      res: (res: { statusCode: number }) => ({ status: res.statusCode }),
    },
    customProps: (req: IncomingMessage) => {
      const user = (req as WithUser).user;
      return user?.id != null ? { userId: user.id } : {};
    },
    quietReqLogger: true,
  });
