// The orphan reconciler in its own process, so a test can point it at a private uploads folder (UPLOADS_DIR in its
// environment) and at a time after the age limit, without touching files other test files have in flight.
// Usage: tsx tests/support/reconcile-child.ts <ms to add to now>; prints the removed files as JSON on stdout.
import { reconcileOrphans } from '../../server/media/reconcile.ts';
import { sequelize } from '../../server/models/index.ts';

const ahead = Number(process.argv[2] ?? 0);
const removed = await reconcileOrphans({ now: new Date(Date.now() + ahead) });
process.stdout.write(`${JSON.stringify(removed)}\n`);
await sequelize.close();
