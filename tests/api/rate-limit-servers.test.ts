import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { hashPassword } from '../../server/auth/passwords.ts';
import { LOGIN_LIMITS, RESET_LIMITS } from '../../server/auth/rate-limit.ts';
import { sequelize, User } from '../../server/models/index.ts';
import { freePort, startServerProcess, type ServerProcess } from '../support/server.ts';

// Issue 16: two app server processes on one database share the sign-in and reset limits, and a restarted server
// still refuses. Each server is a real `server/index.ts` process on its own port; the counters are in MariaDB.
let a: ServerProcess;
let b: ServerProcess;

beforeAll(async () => {
  const [portA, portB] = [await freePort(), await freePort()];
  [a, b] = await Promise.all([startServerProcess(portA), startServerProcess(portB)]);
}, 180_000);

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await sequelize.close();
});

const unique = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;
// The child servers trust loopback proxies (tests/support/server.ts), so X-Forwarded-For names the client; a random one per test.
const randomIp = () => `10.${[0, 0, 0].map(() => Math.floor(Math.random() * 250) + 1).join('.')}`;

const login = (server: ServerProcess, email: string, password: string, ip: string) =>
  request(server.url)
    .post('/api/auth/login')
    .set('Origin', server.url)
    .set('X-Forwarded-For', ip)
    .send({ email, password });

const askReset = (server: ServerProcess, email: string, ip: string) =>
  request(server.url)
    .post('/api/auth/password-reset')
    .set('Origin', server.url)
    .set('X-Forwarded-For', ip)
    .send({ email });

describe('rate limits shared by app servers on one database', () => {
  it('counts failed sign-ins on A and B together; after A refuses, B refuses; a restarted server still refuses', async () => {
    const email = `two-servers-${unique()}@limits.test`;
    await User.create({
      email,
      name: 'Tamsin Abery',
      role: 'researcher',
      passwordHash: await hashPassword('the-right-password'),
    });
    const ip = randomIp();
    // Half the failures on A, the rest on B: the count is one.
    const half = Math.floor(LOGIN_LIMITS.perEmail / 2);
    for (let i = 0; i < half; i++) await login(a, email, 'wrong password', ip).expect(401);
    for (let i = half; i < LOGIN_LIMITS.perEmail; i++) await login(b, email, 'wrong password', ip).expect(401);
    const refusedByA = await login(a, email, 'the-right-password', ip).expect(429);
    expect(refusedByA.body.error.code).toBe('too_many_attempts');
    const refusedByB = await login(b, email, 'the-right-password', randomIp()).expect(429);
    expect(refusedByB.body.error.message).toMatch(/Too many failed sign-in attempts/);

    // Restart B: a new process, nothing in memory, still refuses.
    const port = b.port;
    await b.stop();
    b = await startServerProcess(port);
    await login(b, email, 'the-right-password', randomIp()).expect(429);
  }, 180_000);

  it('counts password-reset requests per IP address across servers', async () => {
    const ip = randomIp();
    for (let i = 0; i < RESET_LIMITS.perIp; i++)
      await askReset(i % 2 ? a : b, `nobody-${i}-${unique()}@limits.test`, ip).expect(202);
    await askReset(a, `one-more-${unique()}@limits.test`, ip).expect(429);
    await askReset(b, `one-more-${unique()}@limits.test`, ip).expect(429);
    await askReset(b, `someone-${unique()}@limits.test`, randomIp()).expect(202);
  }, 60_000);
});
