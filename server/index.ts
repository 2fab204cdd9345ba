import { env, publicUrl } from './env.ts';
import { createApp } from './app.ts';
import { migrate, seed } from './db/setup.ts';
import { sequelize } from './models/index.ts';
import { startLocalMail } from './mail/index.ts';
import { startWorker, stopWorker } from './jobs/worker.ts';
import { enqueueMissingIngest } from './jobs/handlers/ingest-photo.ts';
import { reconcileOrphans } from './media/reconcile.ts';
import { startConfiguredFake } from './storage/index.ts';
import { sweepExpiredUploads } from './routes/uploads/index.ts';

// The running server: migrate, seed an empty database, then listen. SIGINT/SIGTERM close cleanly.
// STORAGE_URL …&fake=1 (development): the local S3 fake, started first, since the demo seed already stores photos.
const s3Fake = env.NODE_ENV === 'production' ? null : await startConfiguredFake();
if (s3Fake) console.log(`[tinctoria] local S3 fake on ${s3Fake.endpoint}, objects in $DATA_DIR/s3`);
const applied = await migrate();
if (applied.length) console.log(`[tinctoria] migrations applied: ${applied.join(', ')}`);
const seeded = await seed();
if (seeded.demo) console.log('[tinctoria] demo scenario seeded');

// Outside production and without SMTP_URL, mail goes to the local catcher (files under $DATA_DIR/mail/).
const catcher = env.SMTP_URL || env.NODE_ENV === 'production' ? null : await startLocalMail();
if (catcher) console.log(`[tinctoria] local mail catcher on 127.0.0.1:${catcher.port}, messages in ${catcher.dir}`);
else if (!env.SMTP_URL)
  console.warn('[tinctoria] SMTP_URL is not set: invitations and password resets cannot be mailed');
// The worker runs beside the web server; any number of servers may share the jobs table.
startWorker();

// Listen at once: the search indexes load in the background (search answers 503 search_warming with Retry-After
// until they are in), then follow the change log that every server writes to (server/search/README.md).
const app = createApp();
const { searchEngine } = await import('./search/engine.ts');
searchEngine.startFollowing();
const server = app.listen(env.PORT, env.HOST, () => {
  console.log(`[tinctoria] serving at ${publicUrl}`);
});
// Photos still waiting with no ingest job (from before ingest jobs) are queued in the background, in batches.
void enqueueMissingIngest().then(
  (n) => n && console.log(`[tinctoria] ingest queued for ${n} photo(s)`),
  (e) => console.error('[tinctoria] queueing missing ingest', e),
);
// Resumable uploads abandoned for longer than TUS_EXPIRY_HOURS.
void sweepExpiredUploads().then(
  (n) => n && console.log(`[tinctoria] removed ${n} expired partial upload(s)`),
  (e) => console.error('[tinctoria] expired uploads sweep', e),
);
// Masters and temp files left by a process killed mid-upload (no photo points at them, older than an hour).
void reconcileOrphans().then(
  (orphans) => orphans.length && console.log(`[tinctoria] removed ${orphans.length} orphan file(s) under uploads/`),
  (e) => console.error('[tinctoria] orphan sweep', e),
);

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  console.log(`[tinctoria] ${signal}: shutting down`);
  server.close();
  server.closeAllConnections();
  await catcher?.close().catch(() => {});
  await s3Fake?.close().catch(() => {});
  searchEngine.stopFollowing();
  await stopWorker().catch(() => {});
  await sequelize.close().catch(() => {});
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
