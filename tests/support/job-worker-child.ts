// A worker in its own process for the lease test (tests/api/jobs.test.ts): it claims one job of the given kind,
// says "claimed <id>" on stdout and then runs a handler that never finishes, renewing its lease, until the test
// kills it with SIGKILL. Usage: tsx tests/support/job-worker-child.ts <type> <leaseMs>
import { registerHandler } from '../../server/jobs/registry.ts';
import { runOnce } from '../../server/jobs/worker.ts';

const [type, leaseArg] = process.argv.slice(2);
registerHandler(type, {
  async run(job) {
    process.stdout.write(`claimed ${job.id}\n`);
    await new Promise(() => {});
  },
});
await runOnce({ types: [type], leaseMs: Number(leaseArg), workerId: `child:${process.pid}` });
