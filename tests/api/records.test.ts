import { createHash } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse } from 'csv-parse/sync';
import { createApp } from '../../server/app.ts';
import { AuditEvent, sequelize } from '../../server/models/index.ts';
import { makeDisplayPeriod, makePhoto, makePiece, makeRegion } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { reportPdf } from '../support/report-pdf.ts';

const app = createApp();
afterAll(() => sequelize.close());

const hplc = {
  method: 'HPLC-DAD',
  site: 'red ground, loose warp thread',
  laboratory: 'Test bench',
  analyst: 'A. Tester',
  analysedOn: '2024-05-02',
  findings: [
    { substance: 'alizarin', confidence: 'confirmed' },
    { substance: 'purpurin', confidence: 'probable' },
    { substance: 'luteolin', confidence: 'possible' },
    { substance: 'Al', confidence: 'confirmed' },
  ],
};

describe('analyses', () => {
  it('lets a researcher record an HPLC analysis; its findings suggest madder and alum; visitors read it once published', async () => {
    const piece = await makePiece({ status: 'draft', dyestuffs: [{ name: 'madder', evidence: 'attributed' }] });
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher.post(`/api/pieces/${piece.id}/analyses`).set('Origin', ORIGIN).send(hplc).expect(201);
    expect(res.body.analysis).toMatchObject({ method: 'HPLC-DAD', analysedOn: '2024-05-02', report: null });
    // Madder: alizarin (confirmed) and purpurin (probable); luteolin only "possible", so weld is not suggested.
    expect(res.body.analysis.suggests).toEqual([
      { name: 'madder', kind: 'dyestuff', markers: ['alizarin', 'purpurin'], confidence: 'confirmed' },
      { name: 'aluminium (alum)', kind: 'mordant', markers: ['Al'], confidence: 'confirmed' },
    ]);
    const older = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({ ...hplc, method: 'XRF', analysedOn: '2023-01-10', findings: [] })
      .expect(201);
    const list = await researcher.get(`/api/pieces/${piece.id}/analyses`).expect(200);
    expect(list.body.items.map((a: { id: number }) => a.id)).toEqual([res.body.analysis.id, older.body.analysis.id]);
    expect(list.body.canCreate).toBe(true);
    // A visitor does not learn of a draft's analyses.
    await request(app).get(`/api/pieces/${piece.id}/analyses`).expect(404);
    await request(app).get(`/api/analyses/${res.body.analysis.id}`).expect(404);
    await piece.update({ status: 'published' });
    const seen = await request(app).get(`/api/pieces/${piece.id}/analyses`).expect(200);
    expect(seen.body.items).toHaveLength(2);
    expect(seen.body.canCreate).toBe(false);
    const history = await researcher.get(`/api/pieces/${piece.id}/history`).expect(200);
    expect(history.body.items.map((e: { action: string }) => e.action)).toContain('analysis-added');
  });

  it('refuses a dyer, and malformed analyses with a message beside each field', async () => {
    const piece = await makePiece();
    const dyer = await signedInAgent(app, 'dyer');
    await dyer.post(`/api/pieces/${piece.id}/analyses`).set('Origin', ORIGIN).send(hplc).expect(403);
    const researcher = await signedInAgent(app, 'researcher');
    const bad = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({
        method: 'guesswork',
        analysedOn: '2024-13-40',
        findings: [{ substance: '', confidence: 'maybe' }],
      })
      .expect(400);
    const fields = bad.body.error.details.fields;
    expect(Object.keys(fields)).toEqual(
      expect.arrayContaining(['method', 'analysedOn', 'findings.0.substance', 'findings.0.confidence']),
    );
    expect(fields.method[0]).toBe('Choose a method');
    expect(fields['findings.0.confidence'][0]).toBe('Choose confirmed, probable, possible or not found');
    const noSite = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({ method: 'FORS', analysedOn: '2024-01-02' })
      .expect(400);
    expect(noSite.body.error.details.fields.site[0]).toMatch(/Describe the sample or site/);
    // A region must be of a photo of this piece.
    const other = await makePiece();
    const { photo } = await makePhoto({ pieceId: other.id });
    const region = await makeRegion({ photoId: photo.id, purpose: 'sampling-site' });
    const wrongRegion = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({ ...hplc, regionId: region.id })
      .expect(400);
    expect(wrongRegion.body.error.details.fields.regionId[0]).toBe('Choose a region of a photo of this piece');
  });

  it('keeps the report PDF by its SHA-256, checks it by content, and serves it to the team only', async () => {
    const piece = await makePiece({ status: 'published' });
    const researcher = await signedInAgent(app, 'researcher');
    const { body } = await researcher.post(`/api/pieces/${piece.id}/analyses`).set('Origin', ORIGIN).send(hplc);
    const id = body.analysis.id as number;
    const notPdf = await researcher
      .post(`/api/analyses/${id}/report`)
      .set('Origin', ORIGIN)
      .attach('report', Buffer.from('<html><body>This is a web page, not a lab report.</body></html>'), 'report.pdf')
      .expect(400);
    expect(notPdf.body.error.details.fields.report[0]).toMatch(
      /Attach a PDF \(it does not start with the PDF header\)/,
    );
    const pdf = await reportPdf();
    const cut = await researcher
      .post(`/api/analyses/${id}/report`)
      .set('Origin', ORIGIN)
      .attach('report', pdf.subarray(0, Math.floor(pdf.length / 2)), 'cut.pdf')
      .expect(400);
    expect(cut.body.error.message).toMatch(/not a PDF we can read/);
    const ok = await researcher
      .post(`/api/analyses/${id}/report`)
      .set('Origin', ORIGIN)
      .attach('report', pdf, 'hplc-report.pdf')
      .expect(201);
    const sha256 = createHash('sha256').update(pdf).digest('hex');
    expect(ok.body.analysis.report).toEqual({
      sha256,
      bytes: pdf.length,
      name: 'hplc-report.pdf',
      url: `/api/analyses/${id}/report`,
    });
    const file = await researcher
      .get(`/api/analyses/${id}/report`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(
      createHash('sha256')
        .update(file.body as Buffer)
        .digest('hex'),
    ).toBe(sha256);
    await request(app).get(`/api/analyses/${id}/report`).expect(401);
    const visitorView = await request(app).get(`/api/analyses/${id}`).expect(200);
    expect(visitorView.body.analysis.report.url).toBeNull();
  });
});

describe('"identified" points at the analysis behind it', () => {
  it('refuses identified without an analysis of this piece, keeps it with one, and keeps the analysis while cited', async () => {
    const piece = await makePiece({ dyestuffs: [{ name: 'madder', evidence: 'attributed' }] });
    const other = await makePiece();
    const curator = await signedInAgent(app, 'curator');
    const researcher = await signedInAgent(app, 'researcher');
    const bare = await curator
      .patch(`/api/pieces/${piece.id}`)
      .set('Origin', ORIGIN)
      .send({ dyestuffs: [{ name: 'madder', evidence: 'identified' }] })
      .expect(400);
    expect(bare.body.error.details.fields['dyestuffs.0.analysisId'][0]).toBe(
      'Choose the analysis that identified it (record the analysis first)',
    );
    const foreign = (
      await researcher.post(`/api/pieces/${other.id}/analyses`).set('Origin', ORIGIN).send(hplc).expect(201)
    ).body.analysis.id;
    const wrong = await curator
      .patch(`/api/pieces/${piece.id}`)
      .set('Origin', ORIGIN)
      .send({ dyestuffs: [{ name: 'madder', evidence: 'identified', analysisId: foreign }] })
      .expect(400);
    expect(wrong.body.error.details.fields['dyestuffs.0.analysisId'][0]).toBe(
      'Choose one of the analyses of this piece',
    );
    const own = (await researcher.post(`/api/pieces/${piece.id}/analyses`).set('Origin', ORIGIN).send(hplc)).body
      .analysis.id;
    const ok = await curator
      .patch(`/api/pieces/${piece.id}`)
      .set('Origin', ORIGIN)
      .send({
        dyestuffs: [{ name: 'madder', evidence: 'identified', analysisId: own }],
        historicalMordants: [{ name: 'potash alum', evidence: 'attributed', analysisId: own }],
      })
      .expect(200);
    expect(ok.body.piece.dyestuffs).toEqual([{ name: 'madder', evidence: 'identified', analysisId: own }]);
    // An attributed entry points at nothing.
    expect(ok.body.piece.historicalMordants).toEqual([
      { name: 'potash alum', evidence: 'attributed', analysisId: null },
    ]);
    const cited = await researcher.delete(`/api/analyses/${own}`).set('Origin', ORIGIN).expect(409);
    expect(cited.body.error.message).toMatch(/record behind madder \(identified\)/);
    await researcher.delete(`/api/analyses/${foreign}`).set('Origin', ORIGIN).expect(204);
    // A new piece has no analyses yet.
    const created = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send({
        accessionNumber: `2097.${Date.now() % 1_000_000}.1`,
        objectName: 'panel',
        title: 'New identified',
        dyestuffs: [{ name: 'madder', evidence: 'identified', analysisId: own }],
      })
      .expect(400);
    expect(created.body.error.details.fields['dyestuffs.0.analysisId'][0]).toMatch(/A new piece has no analyses yet/);
  });
});

describe('condition reports', () => {
  it('records dated reports, lists them newest first, and writes them into the history', async () => {
    const piece = await makePiece();
    const curator = await signedInAgent(app, 'curator');
    const { photo } = await makePhoto({ pieceId: piece.id });
    await curator
      .post(`/api/pieces/${piece.id}/condition-reports`)
      .set('Origin', ORIGIN)
      .send({ assessedOn: '2019-05-14', assessor: 'H. Quill', state: 'fair', notes: 'Two old darns.' })
      .expect(201);
    const newer = await curator
      .post(`/api/pieces/${piece.id}/condition-reports`)
      .set('Origin', ORIGIN)
      .send({ assessedOn: '2024-02-06', assessor: 'H. Quill', state: 'fair, stable', photoIds: [photo.id] })
      .expect(201);
    expect(newer.body.report).toMatchObject({ state: 'fair, stable', photoIds: [photo.id], notes: null });
    const list = await curator.get(`/api/pieces/${piece.id}/condition-reports`).expect(200);
    expect(list.body.items.map((r: { assessedOn: string }) => r.assessedOn)).toEqual(['2024-02-06', '2019-05-14']);
    const events = await AuditEvent.findAll({
      where: { entity: 'piece', entityId: piece.id, action: 'condition-reported' },
    });
    expect(events).toHaveLength(2);
    // The CSV export carries them too, newest first, in one cell (export-only: the import ignores the column).
    const csv = (await curator.get('/api/export/pieces.csv').buffer(true).expect(200)).text;
    const rows: Array<Record<string, string>> = parse(csv, { columns: true });
    expect(rows.find((r) => r.accessionNumber === piece.accessionNumber)?.conditionReports).toBe(
      '2024-02-06: fair, stable (H. Quill); 2019-05-14: fair (H. Quill)',
    );
    const other = await makePiece();
    const { photo: foreign } = await makePhoto({ pieceId: other.id });
    const bad = await curator
      .post(`/api/pieces/${piece.id}/condition-reports`)
      .set('Origin', ORIGIN)
      .send({ assessedOn: '2024-02-07', assessor: '', state: 'ok', photoIds: [foreign.id] })
      .expect(400);
    expect(bad.body.error.details.fields.assessor[0]).toBe('Enter who assessed the piece');
    const bad2 = await curator
      .post(`/api/pieces/${piece.id}/condition-reports`)
      .set('Origin', ORIGIN)
      .send({ assessedOn: '2024-02-07', assessor: 'H. Quill', state: 'ok', photoIds: [foreign.id] })
      .expect(400);
    expect(bad2.body.error.details.fields.photoIds[0]).toBe('Choose photos of this piece');
    const researcher = await signedInAgent(app, 'researcher');
    await researcher
      .post(`/api/pieces/${piece.id}/condition-reports`)
      .set('Origin', ORIGIN)
      .send({ assessedOn: '2024-02-07', assessor: 'R', state: 'ok' })
      .expect(403);
    await request(app).get(`/api/pieces/${piece.id}/condition-reports`).expect(401);
  });
});

describe('display periods and the light dose', () => {
  it('adds up lux·hours, warns before the annual allowance is exceeded, and records it only when confirmed', async () => {
    // Madder: medium responsivity, 150 000 lx·h a year (CIE 157:2004, recalled from memory).
    const piece = await makePiece({ dyestuffs: [{ name: 'madder', evidence: 'attributed' }] });
    const curator = await signedInAgent(app, 'curator');
    // 2024-03-01..2024-03-31: 31 days × 50 lx × 8 h = 12 400 lx·h.
    const first = await curator
      .post(`/api/pieces/${piece.id}/displays`)
      .set('Origin', ORIGIN)
      .send({ from: '2024-03-01', to: '2024-03-31', lux: 50, hoursPerDay: 8, uvMicrowattsPerLumen: 10 })
      .expect(201);
    expect(first.body.display).toMatchObject({ days: 31, luxHours: 12_400, uvAboveGuide: false });
    expect(first.body.lightDose).toMatchObject({
      luxHours: 12_400,
      category: 'medium',
      annualLimitLuxHours: 150_000,
      byYear: [{ year: 2024, luxHours: 12_400, days: 31 }],
    });
    // 2024-04-01..2024-12-31 at 100 lx, 8 h: 275 days × 800 = 220 000; with March 232 400 > 150 000.
    const big = { from: '2024-04-01', to: '2024-12-31', lux: 100, hoursPerDay: 8 };
    const check = await curator
      .post(`/api/pieces/${piece.id}/displays/check`)
      .set('Origin', ORIGIN)
      .send(big)
      .expect(200);
    expect(check.body.exceeds).toEqual([{ year: 2024, luxHours: 232_400, limitLuxHours: 150_000 }]);
    expect(check.body.message).toMatch(/over its annual light allowance/);
    const refused = await curator.post(`/api/pieces/${piece.id}/displays`).set('Origin', ORIGIN).send(big).expect(422);
    expect(refused.body.error.details).toMatchObject({ needsConfirmation: true });
    const list0 = await curator.get(`/api/pieces/${piece.id}/displays`).expect(200);
    expect(list0.body.items).toHaveLength(1);
    await curator
      .post(`/api/pieces/${piece.id}/displays`)
      .set('Origin', ORIGIN)
      .send({ ...big, confirm: true })
      .expect(201);
    const list = await curator.get(`/api/pieces/${piece.id}/displays`).expect(200);
    expect(list.body.items.map((d: { from: string }) => d.from)).toEqual(['2024-04-01', '2024-03-01']);
    expect(list.body.lightDose.luxHours).toBe(232_400);
    // The piece itself answers its light dose (signed in; visitors get null).
    const detail = await curator.get(`/api/pieces/${piece.id}`).expect(200);
    expect(detail.body.lightDose).toMatchObject({ luxHours: 232_400, category: 'medium' });
    await piece.update({ status: 'published' });
    expect((await request(app).get(`/api/pieces/${piece.id}`).expect(200)).body.lightDose).toBeNull();
    const history = await AuditEvent.findAll({
      where: { entity: 'piece', entityId: piece.id, action: 'display-logged' },
    });
    expect(history).toHaveLength(2);
  });

  it('counts overlapping periods once a day and answers bad input beside the field', async () => {
    const piece = await makePiece({ dyestuffs: [{ name: 'indigo', evidence: 'attributed' }] });
    await makeDisplayPeriod({
      pieceId: piece.id,
      fromDate: '2023-01-01',
      toDate: '2023-01-10',
      lux: 50,
      hoursPerDay: 10,
    });
    await makeDisplayPeriod({
      pieceId: piece.id,
      fromDate: '2023-01-06',
      toDate: '2023-01-15',
      lux: 80,
      hoursPerDay: 10,
    });
    const curator = await signedInAgent(app, 'curator');
    // Days 1–5 at 500 lx·h, days 6–15 at 800 lx·h: 2 500 + 8 000 = 10 500 (not 5 000 + 8 000).
    const list = await curator.get(`/api/pieces/${piece.id}/displays`).expect(200);
    expect(list.body.lightDose).toMatchObject({ luxHours: 10_500, daysOnDisplay: 15 });
    const bad = await curator
      .post(`/api/pieces/${piece.id}/displays`)
      .set('Origin', ORIGIN)
      .send({ from: '2024-05-10', to: '2024-05-01', lux: -3, hoursPerDay: 25 })
      .expect(400);
    expect(bad.body.error.details.fields).toMatchObject({
      lux: ['The illuminance must be more than 0 lux'],
      hoursPerDay: ['A day has at most 24 hours'],
    });
    const order = await curator
      .post(`/api/pieces/${piece.id}/displays`)
      .set('Origin', ORIGIN)
      .send({ from: '2024-05-10', to: '2024-05-01', lux: 50, hoursPerDay: 8 })
      .expect(400);
    expect(order.body.error.details.fields.to).toEqual(['The display ends before it starts']);
    const researcher = await signedInAgent(app, 'researcher');
    await researcher
      .post(`/api/pieces/${piece.id}/displays`)
      .set('Origin', ORIGIN)
      .send({ from: '2024-05-01', to: '2024-05-02', lux: 50, hoursPerDay: 8 })
      .expect(403);
    await request(app).get(`/api/pieces/${piece.id}/displays`).expect(401);
  });
});

describe('an analysis marks the entries it identifies', () => {
  it('turns the named dyestuffs identified, pointing at it, and refuses a name not on the piece', async () => {
    const piece = await makePiece({
      status: 'published',
      dyestuffs: [
        { name: 'madder', evidence: 'attributed' },
        { name: 'weld', evidence: 'attributed' },
      ],
    });
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({ ...hplc, identifies: ['madder'] })
      .expect(201);
    const detail = await request(app).get(`/api/pieces/${piece.id}`).expect(200);
    expect(detail.body.piece.dyestuffs).toEqual([
      { name: 'madder', evidence: 'identified', analysisId: res.body.analysis.id },
      { name: 'weld', evidence: 'attributed' },
    ]);
    const bad = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({ ...hplc, identifies: ['cochineal'] })
      .expect(400);
    expect(bad.body.error.details.fields.identifies[0]).toBe('Not a dyestuff or mordant of this piece: cochineal');
  });
});

describe('"identified by" facet values (for the search index)', () => {
  it('gives the methods of the analyses that identified entries of each piece', async () => {
    const { identifiedByMethods } = await import('../../server/services/records/identified-by.ts');
    const { makeAnalysis } = await import('../../server/seed/factories.ts');
    const piece = await makePiece({
      dyestuffs: [
        { name: 'madder', evidence: 'attributed' },
        { name: 'indigo', evidence: 'attributed' },
      ],
      historicalMordants: [{ name: 'potash alum', evidence: 'attributed' }],
    });
    const hplcA = await makeAnalysis({ pieceId: piece.id, method: 'HPLC-DAD' });
    const xrf = await makeAnalysis({ pieceId: piece.id, method: 'XRF' });
    await makeAnalysis({ pieceId: piece.id, method: 'FORS' }); // cited by nothing
    await piece.update({
      dyestuffs: [
        { name: 'madder', evidence: 'identified', analysisId: hplcA.id },
        { name: 'indigo', evidence: 'identified', analysisId: hplcA.id },
      ],
      historicalMordants: [{ name: 'potash alum', evidence: 'identified', analysisId: xrf.id }],
    });
    const bare = await makePiece({ dyestuffs: [{ name: 'weld', evidence: 'attributed' }] });
    const methods = await identifiedByMethods([piece.id, bare.id]);
    expect(methods.get(piece.id)).toEqual(['HPLC-DAD', 'XRF']);
    expect(methods.has(bare.id)).toBe(false);
  });
});
