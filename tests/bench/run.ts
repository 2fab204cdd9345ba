import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { env } from '../../server/env.ts';
import { benches } from './index.ts';

// Runs every registered benchmark (or those named on the command line), prints
// a table, and writes the figures to $DATA_DIR/bench/results.json.
const only = process.argv.slice(2);
const results: Array<{ bench: string; metric: string; value: number; unit: string; target?: string; pass?: boolean }> =
  [];
for (const b of benches) {
  if (only.length && !only.includes(b.name)) continue;
  console.error(`[bench] ${b.name}…`);
  for (const r of await b.run()) results.push({ bench: b.name, ...r });
}
console.table(results.map((r) => ({ ...r, value: Number(r.value.toFixed(3)) })));
const out = path.join(env.DATA_DIR, 'results.json');
mkdirSync(path.dirname(out), { recursive: true });
writeFileSync(out, JSON.stringify({ at: new Date().toISOString(), results }, null, 2));
console.log(`written to ${out}`);
process.exit(0);
