import { env, publicUrl } from './env.ts';
import { createApp } from './app.ts';
import { migrate, seed } from './db/setup.ts';
import { sequelize } from './models/index.ts';

// The running server: migrate, seed an empty database, then listen. SIGINT/SIGTERM close cleanly.
const applied = await migrate();
if (applied.length) console.log(`[tinctoria] migrations applied: ${applied.join(', ')}`);
const seeded = await seed();
if (seeded.demo) console.log('[tinctoria] demo scenario seeded');

const app = createApp();
const { searchEngine } = await import('./search/engine.ts');
const t0 = Date.now();
await searchEngine.ready();
console.log(`[tinctoria] search indexes loaded in ${Date.now() - t0} ms`);
const server = app.listen(env.PORT, env.HOST, () => {
  console.log(`[tinctoria] serving at ${publicUrl}`);
});

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  console.log(`[tinctoria] ${signal}: shutting down`);
  server.close();
  server.closeAllConnections();
  await sequelize.close().catch(() => {});
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
