import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { DEFAULT_MEDIA_MAX_BYTES, DEFAULT_MEDIA_MAX_PIXELS } from '../shared/schemas/photo.ts';

// Configuration is parsed once, here; nothing else reads process.env.
// The project folder: the nearest folder above this file with package.json and server/ (this file runs from
// server/env.ts under tsx, and from dist/server/index.mjs once bundled for `npm start`).
function projectRoot(from: string) {
  for (let d = from; ; d = path.dirname(d)) {
    if (existsSync(path.join(d, 'package.json')) && existsSync(path.join(d, 'server'))) return d;
    if (path.dirname(d) === d) return path.resolve(from, '..');
  }
}
export const ROOT_DIR = projectRoot(path.dirname(fileURLToPath(import.meta.url)));

const GiB = 1024 * 1024 * 1024;

const schema = z
  .object({
    NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().default('127.0.0.1'),
    PUBLIC_URL: z.string().url().optional(),
    DATABASE_URL: z
      .string({ error: 'DATABASE_URL is required (npm start sets it after starting the project MariaDB)' })
      .regex(/^(mariadb|mysql):\/\//, 'DATABASE_URL must start with mariadb:// or mysql://'),
    DATA_DIR: z.string().default(path.join(ROOT_DIR, '.data')),
    UPLOADS_DIR: z.string().default(path.join(ROOT_DIR, 'uploads')),
    // Where masters, derivatives, tiles and report PDFs are stored (server/storage/README.md): unset or file: the
    // UPLOADS_DIR folder; s3://bucket?endpoint=…&region=…&forcePathStyle=true any S3-compatible object storage, with
    // the credentials below (unset: the AWS SDK's own chain, e.g. an instance role). Uploads are still staged under
    // UPLOADS_DIR/tmp on each server.
    STORAGE_URL: z
      .string()
      .regex(/^(file|s3):/, 'STORAGE_URL must start with file: or s3://')
      .optional(),
    AWS_ACCESS_KEY_ID: z.string().optional(),
    AWS_SECRET_ACCESS_KEY: z.string().optional(),
    SESSION_SECRET: z.string().min(16).optional(),
    SMTP_URL: z.string().url().optional(),
    MAIL_FROM: z.string().default('Tinctoria <no-reply@tinctoria.local>'),
    APP_DEV: z.enum(['0', '1']).default('0'),
    SEED: z.enum(['demo', 'reference', 'none']).default('demo'),
    DB_LOG: z.enum(['0', '1']).default('0'),
    // Express's `trust proxy`: off by default, so X-Forwarded-For from any client cannot choose its own IP
    // (the per-IP sign-in limit). Behind a reverse proxy: its address/CIDR list ("10.0.0.5, 10.0.1.0/24",
    // "loopback") or the number of proxy hops ("1").
    TRUST_PROXY: z
      .string()
      .trim()
      .default('')
      .transform((v): boolean | number | string =>
        v === '' || v === '0' || v === 'false' ? false : /^\d+$/.test(v) ? Number(v) : v,
      ),
    // Host names this server answers to (comma-separated), besides PUBLIC_URL's; any other Host header is
    // refused with 400 (DNS rebinding). Outside production 127.0.0.1, localhost and ::1 are allowed too.
    ALLOWED_HOSTS: z
      .string()
      .default('')
      .transform((v) =>
        v
          .split(',')
          .map((h) => h.trim().toLowerCase())
          .filter(Boolean),
      ),
    // How long a running job's lease lasts; the worker renews it every third of this while the handler runs, and a
    // job whose lease ran out (its worker died) is queued again. 30 s: common practice for lease/heartbeat queues.
    JOB_LEASE_MS: z.coerce.number().int().min(500).max(600_000).default(30_000),
    /** How often each app server reads the search change log (ms); a search also catches up before it answers. */
    SEARCH_POLL_MS: z.coerce.number().int().min(50).max(60_000).default(500),
    /** The longest a search waits to catch up with the change log before answering from the index as it is (ms;
     *  unset: 1 s, or 60 s under NODE_ENV=test, where exactness matters more than latency on a loaded machine). */
    SEARCH_SYNC_WAIT_MS: z.coerce.number().int().min(0).optional(),
    /** Hours the search change log is kept; a server that fell further behind reloads its indexes. */
    SEARCH_LOG_KEEP_HOURS: z.coerce
      .number()
      .min(1)
      .max(24 * 30)
      .default(24),
    /** pino level of the request and job logs; 'silent' by default in tests. */
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
    // Uploads stream to files under UPLOADS_DIR/tmp (server/http/upload.ts), never whole in memory. One request may
    // carry at most UPLOAD_MAX_REQUEST_BYTES (413 beyond); one process receives at most UPLOAD_MAX_CONCURRENT uploads
    // and UPLOAD_MAX_PROCESS_BYTES declared bytes at once (503 with Retry-After beyond). Defaults: 4 GiB per request
    // (one master at the largest MEDIA_MAX_BYTES, or twenty 200 MB TIFFs), 8 GiB and 8 uploads per process: common
    // practice (sized to the disk, not to memory).
    UPLOAD_MAX_REQUEST_BYTES: z.coerce
      .number()
      .int()
      .min(1024)
      .default(4 * GiB),
    UPLOAD_MAX_PROCESS_BYTES: z.coerce
      .number()
      .int()
      .min(1024)
      .default(8 * GiB),
    UPLOAD_MAX_CONCURRENT: z.coerce.number().int().min(1).default(8),
    // One image file (a photo's master): at most MEDIA_MAX_BYTES (413 beyond) and MEDIA_MAX_PIXELS pixels (422 beyond,
    // read from the header before any pixel is decoded). Defaults 2 GiB and 1 gigapixel: a museum's 16-bit TIFFs are
    // usually 150–500 MB, a stitched long textile can pass a gigapixel. The pipeline reads masters with libvips'
    // sequential access and shrink-on-load (server/media/README.md), so memory does not grow with these.
    MEDIA_MAX_BYTES: z.coerce.number().int().min(1024).default(DEFAULT_MEDIA_MAX_BYTES),
    // Resumable uploads (tus 1.0 at /api/uploads, server/routes/uploads/index.ts): partial files under TUS_DIR (default
    // UPLOADS_DIR/incoming/tus, on the same file system as the masters, so a finished upload is renamed, not copied);
    // an upload untouched for TUS_EXPIRY_HOURS (default 24) expires and the orphan sweep removes it.
    TUS_DIR: z.string().optional(),
    TUS_EXPIRY_HOURS: z.coerce
      .number()
      .positive()
      .max(24 * 30)
      .default(24),
    MEDIA_MAX_PIXELS: z.coerce.number().int().min(1_000_000).default(DEFAULT_MEDIA_MAX_PIXELS),
    // Progressive JPEGs, interlaced PNGs and HEIF/AVIF cannot be read in strips: their decoders hold the whole image.
    // They are reduced one way after the other and accepted up to this many pixels (default 50 megapixels, the
    // largest phone and camera files). Measured at 48 MP (server/media/README.md): progressive JPEG 342 MB above
    // idle, interlaced PNG about 200 MB, AVIF 1.0 GB (libheif): the < 600 MB target holds for strip-read formats only.
    MEDIA_MAX_PIXELS_DECODED_WHOLE: z.coerce.number().int().min(1_000_000).default(50_000_000),
    // How long one HTTP request may take to arrive in full (Node's requestTimeout, 5 min by default, cut a 2 GB upload
    // over a slow line); 0 disables. Default 1 hour.
    HTTP_REQUEST_TIMEOUT_MS: z.coerce.number().int().min(0).default(3_600_000),
    /** How long a request waits for a free database connection before a 503 (ms). */
    DB_ACQUIRE_TIMEOUT_MS: z.coerce.number().int().min(100).default(5_000),
    /** How long one query may run before it is abandoned with a 503 (ms); 0 disables. */
    DB_QUERY_TIMEOUT_MS: z.coerce.number().int().min(0).default(10_000),
  })
  .superRefine((v, ctx) => {
    if (v.NODE_ENV === 'production' && !v.SESSION_SECRET) {
      ctx.addIssue({
        code: 'custom',
        path: ['SESSION_SECRET'],
        message: 'SESSION_SECRET (16+ characters) is required in production',
      });
    }
  });

export type Env = z.infer<typeof schema>;

function load(): Env {
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.') || '(env)'}: ${i.message}`);
    console.error(`Tinctoria cannot start: invalid configuration\n${lines.join('\n')}`);
    process.exit(1);
  }
  return parsed.data;
}

export const env = load();
export const isProduction = env.NODE_ENV === 'production';
export const isTest = env.NODE_ENV === 'test';
export const logLevel = env.LOG_LEVEL ?? (isTest ? 'silent' : 'info');
export const publicUrl = env.PUBLIC_URL ?? `http://127.0.0.1:${env.PORT}`;
