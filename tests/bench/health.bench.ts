import autocannon from 'autocannon';
import type { Bench } from './index.ts';

/** Baseline: requests per second and latency of GET /api/health against the real database. */
export const healthBench: Bench = {
  name: 'health',
  async run() {
    const { migrate } = await import('../../server/db/setup.ts');
    const { startServer } = await import('../support/server.ts');
    await migrate();
    const server = await startServer();
    const result = await autocannon({ url: `${server.url}/api/health`, connections: 10, duration: 5 });
    await server.close();
    return [
      { metric: 'requests/s', value: result.requests.average, unit: 'req/s' },
      { metric: 'latency p97.5', value: result.latency.p97_5, unit: 'ms' },
    ];
  },
};
