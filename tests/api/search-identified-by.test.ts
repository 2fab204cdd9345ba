import request from 'supertest';
import { QueryTypes, type Transaction } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { Analysis, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

// Issue 19: "identified by" (the method of the analysis behind an identified dyestuff or mordant) is a search facet,
// kept current by the search change log when an analysis is recorded, changed or removed.
const app = createApp(); // installs the search hooks (server/search/hooks.ts)
afterAll(() => sequelize.close());

// A word no other record uses, so counts are this file's alone.
const u = `idby${Array.from({ length: 10 }, () => 'bcdfghjkmnpqrstvwxz'[Math.floor(Math.random() * 19)]).join('')}`;
const facet = async (query: string) =>
  (await request(app).get(`/api/search?q=${u}&${query}`).expect(200)).body as {
    items: Array<{ id: number }>;
    facets: { identifiedBy: Array<{ value: string; label: string; count: number }> };
  };
const changesFor = async (pieceId: number, transaction?: Transaction) =>
  (
    await sequelize.query<{ n: number }>(
      `SELECT COUNT(*) AS n FROM search_changes WHERE kind = 'piece' AND entityId = ?`,
      { replacements: [pieceId], type: QueryTypes.SELECT, transaction },
    )
  )[0].n;

describe('the "identified by" facet', () => {
  it('counts and filters pieces by the method behind their identified terms, and follows analysis writes', async () => {
    const hplcPiece = await makePiece({
      status: 'published',
      title: `Madder ground ${u}`,
      dyestuffs: [{ name: 'madder', evidence: 'attributed' }],
      historicalMordants: [{ name: 'potash alum', evidence: 'attributed' }],
    });
    const bare = await makePiece({
      status: 'published',
      title: `Unanalysed ${u}`,
      dyestuffs: [{ name: 'madder', evidence: 'attributed' }],
    });
    expect((await facet('')).facets.identifiedBy).toEqual([]);

    const researcher = await signedInAgent(app, 'researcher');
    const record = (pieceId: number, method: string, identifies: string[]) =>
      researcher
        .post(`/api/pieces/${pieceId}/analyses`)
        .set('Origin', ORIGIN)
        .send({ method, analysedOn: '2024-05-02', site: 'loose thread', findings: [], identifies })
        .expect(201);
    const hplc = (await record(hplcPiece.id, 'HPLC-DAD', ['madder'])).body.analysis;
    const xrf = (await record(hplcPiece.id, 'XRF', ['potash alum'])).body.analysis;
    // An analysis that identifies nothing is no "identified by" value.
    await record(bare.id, 'FORS', []);

    const all = await facet('');
    expect(all.facets.identifiedBy).toEqual([
      { value: 'HPLC-DAD', label: 'HPLC-DAD', count: 1 },
      { value: 'XRF', label: 'XRF', count: 1 },
    ]);
    expect((await facet('identifiedBy=HPLC-DAD')).items.map((i) => i.id)).toEqual([hplcPiece.id]);
    // Case as typed does not matter; several methods narrow (the piece carries both).
    expect((await facet('identifiedBy=hplc-dad&identifiedBy=XRF')).items.map((i) => i.id)).toEqual([hplcPiece.id]);
    expect((await facet('identifiedBy=FORS')).items).toEqual([]);

    // Changing only the analysis (not the piece) moves the piece to the new method: the write logged its piece.
    await researcher.patch(`/api/analyses/${xrf.id}`).set('Origin', ORIGIN).send({ method: 'SEM-EDS' }).expect(200);
    expect((await facet('')).facets.identifiedBy.map((f) => f.value)).toEqual(['HPLC-DAD', 'SEM-EDS']);
    expect(hplc.id).toBeGreaterThan(0);
  });

  it('appends the piece to the search change log in the analysis write’s own transaction (none when rolled back)', async () => {
    const piece = await makePiece({ status: 'published', title: `Logged ${u}` });
    const before = await changesFor(piece.id);
    const t = await sequelize.transaction();
    const analysis = await Analysis.create(
      {
        pieceId: piece.id,
        method: 'Raman',
        regionId: null,
        site: 'edge',
        laboratory: null,
        analyst: null,
        analysedOn: '2024-05-02',
        notes: null,
        findings: [],
        reportSha256: null,
        reportBytes: null,
        reportName: null,
        createdById: null,
      },
      { transaction: t },
    );
    await analysis.update({ method: 'FTIR' }, { transaction: t });
    expect(await changesFor(piece.id, t)).toBe(before + 2);
    await t.rollback();
    expect(await changesFor(piece.id)).toBe(before);
    expect(await Analysis.count({ where: { pieceId: piece.id } })).toBe(0);
  });

  it('refuses a malformed value beside the field (400)', async () => {
    const res = await request(app)
      .get(`/api/search?identifiedBy=${'x'.repeat(161)}`)
      .expect(400);
    expect(res.body.error.details.fields['identifiedBy.0'][0]).toMatch(/at most 160/);
  });
});
