import type { RequestHandler } from 'express';
import { HttpError } from './errors.ts';

/**
 * The host names (no port) this server answers to: PUBLIC_URL's, the configured ALLOWED_HOSTS, and outside
 * production the loopback names a developer types.
 */
export function allowedHostnames({
  publicUrl,
  extra,
  production,
}: {
  publicUrl: string;
  extra: string[];
  production: boolean;
}): string[] {
  return [
    new URL(publicUrl).hostname.toLowerCase(),
    ...extra.map((h) => h.toLowerCase()),
    ...(production ? [] : ['127.0.0.1', 'localhost', '[::1]']),
  ];
}

const hostnameOf = (host: string | undefined) => {
  if (!host) return null;
  try {
    return new URL(`http://${host}`).hostname.toLowerCase();
  } catch {
    return null;
  }
};

/**
 * Refuse a request whose Host header names another host (DNS rebinding: a page on a foreign name that
 * resolves to this server must not get answers; common practice, e.g. OWASP "DNS rebinding" guidance and
 * the Host allow-lists of web frameworks). The port is not compared: the proxy decides which ports reach us.
 */
export function hostCheck(allowed: string[]): RequestHandler {
  const hosts = new Set(allowed);
  return (req, _res, next) => {
    const hostname = hostnameOf(req.get('host'));
    if (hostname && hosts.has(hostname)) return next();
    next(new HttpError(400, 'bad_host', 'This server does not answer to that host name.'));
  };
}
