import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { makeUser } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { freePort, startServerProcess, type ServerProcess } from '../support/server.ts';

// Issue 16: a dry run's preview is kept in MariaDB, not in the memory of the server that made it, so another app
// server process on the same database answers its further pages.
const app = createApp();
let b: ServerProcess;

beforeAll(async () => {
  b = await startServerProcess(await freePort());
}, 180_000);

afterAll(async () => {
  await b?.stop();
  await sequelize.close();
});

describe('a dry run made on one server', () => {
  it('is paged by another server process', async () => {
    const email = `preview-${Date.now().toString(36)}@example.test`;
    await makeUser({ email, role: 'curator', password: 'preview-password-1' });
    const tag = `XS.${Date.now().toString(36)}`;
    const lines = ['accessionNumber,objectName,title'];
    for (let i = 1; i <= 150; i++) lines.push(`${tag}.${i},panel,Row ${i}`);

    const onA = await signedInAgent(app, { email, password: 'preview-password-1' });
    const dry = await onA
      .post('/api/import/pieces?dryRun=true')
      .set('Origin', ORIGIN)
      .attach('file', Buffer.from(`${lines.join('\n')}\n`), 'pieces.csv')
      .expect(200);
    expect(dry.body).toMatchObject({ rows: 150, valid: 150, invalid: 0 });

    const onB = request.agent(b.url);
    await onB.post('/api/auth/login').set('Origin', b.url).send({ email, password: 'preview-password-1' }).expect(200);
    const second = await onB.get(`/api/import/previews/${dry.body.id}/rows?page=2`).expect(200);
    expect(second.body).toMatchObject({ total: 150, page: 2, pageSize: 100 });
    expect(second.body.items.map((r: { line: number }) => r.line)).toEqual(
      Array.from({ length: 50 }, (_, i) => 102 + i),
    );
    expect(second.body).toEqual((await onA.get(`/api/import/previews/${dry.body.id}/rows?page=2`).expect(200)).body);
  }, 60_000);
});
