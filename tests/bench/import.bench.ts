import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Bench } from './index.ts';

/** Issue target: a 10,000-row piece CSV checks and imports (one transaction) in under a minute. */
export const importBench: Bench = {
  name: 'csv-import',
  async run() {
    const { migrate } = await import('../../server/db/setup.ts');
    const { sequelize } = await import('../../server/models/index.ts');
    const { seedReference } = await import('../../server/seed/reference.ts');
    const { makeUser } = await import('../../server/seed/factories.ts');
    const { importPieces } = await import('../../server/import/pieces.ts');
    await migrate();
    await sequelize.transaction((t) => seedReference(t));
    const curator = await makeUser({ role: 'curator' });
    const tag = Date.now().toString(36);
    const lines = [
      'accessionNumber,objectName,title,dateEdtf,fibres,techniques,dyestuffs,historicalMordants,heightMm,widthMm,description,status',
    ];
    for (let i = 1; i <= 10_000; i++) {
      lines.push(
        `B${tag}.${i},fragment,"Sample ${i}, block printed",17XX,cotton,block printing; mordant printing,madder (attributed); weld,potash alum (attributed),${200 + (i % 50)},${150 + (i % 30)},"Bench row ${i}",draft`,
      );
    }
    const buffer = Buffer.from(`${lines.join('\n')}\n`, 'utf8');
    const dir = await mkdtemp(path.join(tmpdir(), 'bench-import-'));
    const file = path.join(dir, 'pieces.csv');
    await writeFile(file, buffer);
    const started = performance.now();
    const result = await importPieces({ actor: { id: curator.id, role: 'curator' }, input: { file, mapping: {} } });
    await rm(dir, { recursive: true, force: true });
    const seconds = (performance.now() - started) / 1000;
    await sequelize.close();
    return [
      {
        metric: '10,000-row CSV import',
        value: seconds,
        unit: 's',
        target: '< 60 s',
        pass: seconds < 60 && result.imported === 10_000,
      },
      { metric: 'rows per second', value: result.imported / seconds, unit: 'rows/s' },
      { metric: 'file size', value: buffer.length / 1024 / 1024, unit: 'MB' },
    ];
  },
};
