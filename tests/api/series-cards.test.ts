import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app.ts';
import { Chemical, Dyestuff, Photo, Trial, sequelize } from '../../server/models/index.ts';
import { makePaletteColour, makePiece } from '../../server/seed/factories.ts';
import { hexToLab } from '../../shared/search/lab.ts';
import { trialUrl } from '../../server/pdf/card-data.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { readPdf } from '../support/pdf.ts';

const app = createApp();
let dyer: TestAgent;
const tag = `${Date.now() % 1_000_000}`;
const ids: Record<string, number> = {};
afterAll(() => sequelize.close());
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
  for (const n of ['potash alum', 'iron(II) sulfate (copperas)', 'tannic acid'])
    ids[n] = (await Chemical.findOne({ where: { name: n }, rejectOnEmpty: true })).id;
  ids.madder = (await Dyestuff.findOne({ where: { name: 'madder' }, rejectOnEmpty: true })).id;
});

const factors = () => [
  { name: 'madder', role: 'dyestuff', refId: ids.madder, refName: 'madder', levels: ['25', '50', '100'] },
  {
    name: 'mordant',
    role: 'mordant',
    levels: ['strong Al', 'weak Al', 'Fe', 'Al+Fe'],
    mordants: [
      { level: 'strong Al', chemicals: [{ refId: ids['potash alum'], name: 'potash alum', owf: 15 }] },
      { level: 'weak Al', chemicals: [{ refId: ids['potash alum'], name: 'potash alum', owf: 5 }] },
      {
        level: 'Fe',
        chemicals: [{ refId: ids['iron(II) sulfate (copperas)'], name: 'iron(II) sulfate (copperas)', owf: 2 }],
      },
      {
        level: 'Al+Fe',
        chemicals: [
          { refId: ids['potash alum'], name: 'potash alum', owf: 10 },
          { refId: ids['iron(II) sulfate (copperas)'], name: 'iron(II) sulfate (copperas)', owf: 1 },
        ],
      },
    ],
  },
  { name: 'tannin', role: 'tannin', refId: ids['tannic acid'], refName: 'tannic acid', levels: ['0', '10'] },
];

describe('trial series through the API', () => {
  it('expands 3 × 4 × 2 factors into 24 cells, prunes, scales recipes and creates the planned trials once', async () => {
    const preview = await dyer
      .post('/api/series/preview')
      .set('Origin', ORIGIN)
      .send({ factors: factors() })
      .expect(200);
    expect(preview.body.count).toBe(24);
    const created = await dyer
      .post('/api/series')
      .set('Origin', ORIGIN)
      .send({
        code: `S${tag}`,
        title: 'Madder matrix',
        factors: factors(),
        dryMassG: 20,
        deadVolumePct: 10,
        liquorRatio: 30,
      });
    expect(created.status).toBe(201);
    const s = created.body;
    expect(s.cells).toHaveLength(24);
    // Prune the weak-Al cells without tannin: 24 − 3 = 21 kept.
    const keep = s.cells
      .filter((c: { cell: Record<string, string> }) => !(c.cell.mordant === 'weak Al' && c.cell.tannin === '0'))
      .map((c: { key: string }) => c.key);
    const pruned = (await dyer.patch(`/api/series/${s.id}`).set('Origin', ORIGIN).send({ keep }).expect(200)).body;
    expect(pruned.keptCount).toBe(21);
    // Scaling [BRIEF §4.1]: mass = % owf / 100 × dry mass; madder 50 % on 20 g = 10 g; alum 15 % = 3 g; tannin 10 % = 2 g.
    const cell = pruned.cells.find(
      (c: { cell: Record<string, string> }) =>
        c.cell.madder === '50' && c.cell.mordant === 'strong Al' && c.cell.tannin === '10',
    );
    const grams = Object.fromEntries(
      cell.recipe.flatMap((st: { ingredients: Array<{ name: string; grams: number }> }) =>
        st.ingredients.map((i) => [i.name, i.grams]),
      ),
    );
    expect(grams).toEqual({ 'tannic acid': 2, 'potash alum': 3, madder: 10 });
    // Madder over the 21 kept cells: 7 cells each of 25, 50 and 100 % → 7 × (5 + 10 + 20) = 245 g, +10 % dead volume = 269.5 g.
    const madder = pruned.materials.whole.lines.find((i: { name: string }) => i.name === 'madder');
    expect(madder).toMatchObject({ grams: 245, gramsWithAllowance: 269.5 });

    const made = await dyer.post(`/api/series/${s.id}/trials`).set('Origin', ORIGIN).expect(201);
    expect(made.body.created).toHaveLength(21);
    const codes = made.body.created.map((t: { code: string }) => t.code);
    expect(new Set(codes).size).toBe(21);
    for (const c of codes) expect(c).toMatch(/^T-\d{4}-\d{3,}$/);
    expect(await Trial.count({ where: { seriesId: s.id } })).toBe(21);
    await dyer.post(`/api/series/${s.id}/trials`).set('Origin', ORIGIN).expect(409);
  });

  it('refuses a series whose mordant levels name a historical-only chemical: its planned modern trials could not confirm the use', async () => {
    const lead = await Chemical.findOne({ where: { name: 'lead(II) acetate (sugar of lead)' }, rejectOnEmpty: true });
    const f = factors();
    f[1].mordants![1] = { level: 'weak Al', chemicals: [{ refId: lead.id, name: lead.name, owf: 3 }] };
    const res = await dyer
      .post('/api/series')
      .set('Origin', ORIGIN)
      .send({ code: `SH${tag}`, title: 'Lead series', factors: f, dryMassG: 20, deadVolumePct: 10, liquorRatio: 30 })
      .expect(422);
    expect(res.body.error.details.fields.factors[0]).toMatch(/lead\(II\) acetate .* is for historical recipes only/);
  });

  it('plans a workshop per participant, with a materials list for each pseudonymous code', async () => {
    const res = await dyer
      .post('/api/series')
      .set('Origin', ORIGIN)
      .send({
        code: `W${tag}`,
        title: 'Workshop card',
        kind: 'workshop',
        factors: factors().slice(1),
        participants: ['P-01', 'P-02', 'P-03'],
        dryMassG: 10,
        deadVolumePct: 15,
      });
    expect(res.status).toBe(201);
    expect(res.body.cells).toHaveLength(8);
    expect(res.body.materials.perParticipant.map((p: { code: string }) => p.code)).toEqual(['P-01', 'P-02', 'P-03']);
    // Tannic acid: 4 cells at 10 % of 10 g = 4 g per participant; ×3 = 12 g, +15 % = 13.8 g.
    expect(
      res.body.materials.perParticipant[0].lines.find((i: { name: string }) => i.name === 'tannic acid').grams,
    ).toBe(4);
    expect(res.body.materials.whole.lines.find((i: { name: string }) => i.name === 'tannic acid')).toMatchObject({
      grams: 12,
      gramsWithAllowance: 13.8,
    });
    // Liquor at 1:30 [BRIEF §4.1]: 10 g × 30 = 0.3 L per step; per participant 4 tannin + 8 mordant steps = 3.6 L.
    expect(res.body.materials.perParticipant[0].bathL).toBe(3.6);
    const made = await dyer.post(`/api/series/${res.body.id}/trials`).set('Origin', ORIGIN).expect(201);
    expect(made.body.created).toHaveLength(24);
    expect(made.body.created[0].cell.participant).toBe('P-01');
  });

  it('aims a series at a colour of its piece: its planned trials take that target, and their cards compare with it', async () => {
    const piece = await makePiece({ status: 'published' });
    const other = await makePiece({ status: 'published' });
    const colourOf = async (pieceId: number, hex: string) => {
      const photo = await Photo.create({
        pieceId,
        trialId: null,
        sha256: 'f'.repeat(64),
        format: 'jpeg',
        bytes: 1,
        width: 10,
        height: 10,
        originalName: null,
        caption: null,
        capturedAt: null,
        exif: {},
        gps: null,
        derivatives: {},
        referencePatch: null,
        correction: null,
        createdById: null,
      });
      return makePaletteColour({
        photoId: photo.id,
        regionId: null,
        variant: 'raw',
        rank: 1,
        ...hexToLab(hex),
        hex,
        share: 1,
        spread: 1,
        name: 'red',
        tradeName: null,
        background: false,
      });
    };
    const madderRed = await colourOf(piece.id, '#9b2f2f');
    const elsewhere = await colourOf(other.id, '#2f4f7f');
    const body = {
      code: `T${tag}`,
      title: 'Aimed at the ground',
      pieceId: piece.id,
      factors: factors().slice(2),
      dryMassG: 10,
    };
    // A colour of another piece is refused on the field that named it.
    const wrong = await dyer
      .post('/api/series')
      .set('Origin', ORIGIN)
      .send({ ...body, targetPaletteColourId: elsewhere.id })
      .expect(400);
    expect(wrong.body.error.details.fields).toHaveProperty('targetPaletteColourId');
    await dyer
      .post('/api/series')
      .set('Origin', ORIGIN)
      .send({ ...body, targetPaletteColourId: madderRed.id, targetRegionId: 1 })
      .expect(400);

    const s = (
      await dyer
        .post('/api/series')
        .set('Origin', ORIGIN)
        .send({ ...body, targetPaletteColourId: madderRed.id })
        .expect(201)
    ).body;
    expect(s.target).toEqual({ paletteColourId: madderRed.id, regionId: null, measurementId: null });
    const made = await dyer.post(`/api/series/${s.id}/trials`).set('Origin', ORIGIN).expect(201);
    expect(made.body.created).toHaveLength(2);
    for (const t of made.body.created) {
      const trial = (await dyer.get(`/api/trials/${t.id}`).expect(200)).body.trial;
      expect(trial.target.paletteColourId).toBe(madderRed.id);
      expect(trial.colour.target).toMatchObject({ source: 'image-estimate', illuminant: 'D65', observer: '2' });
    }
    const bin = (url: string) =>
      dyer
        .get(url)
        .buffer(true)
        .parse((r, cb) => {
          const c: Buffer[] = [];
          r.on('data', (x: Buffer) => c.push(x));
          r.on('end', () => cb(null, Buffer.concat(c)));
        });
    const cards = await readPdf((await bin(`/api/series/${s.id}/cards.pdf`).expect(200)).body);
    expect(cards.text).toContain('target (lower strip): image estimate · D65/2°');
    // Its planned recipes: the tannin step with its unit and grams for the 10 g cell, the cell in words with units.
    expect(cards.text).toContain('tannic acid 10 % owf = 1 g');
    expect(cards.text).toContain('tannin 10 % owf');

    // Changing the target needs a colour of the same piece; clearing it is allowed.
    await dyer
      .patch(`/api/series/${s.id}`)
      .set('Origin', ORIGIN)
      .send({ targetPaletteColourId: elsewhere.id })
      .expect(400);
    expect(
      (await dyer.patch(`/api/series/${s.id}`).set('Origin', ORIGIN).send({ targetPaletteColourId: null }).expect(200))
        .body.target.paletteColourId,
    ).toBeNull();
  });
});

describe('sample cards and labels', () => {
  it('a trial card parses, names the trial and carries a QR code that decodes to the trial page', async () => {
    const trial = await Trial.findOne({ where: { code: 'T-2024-001' }, rejectOnEmpty: true });
    const res = await dyer
      .get(`/api/trials/${trial.id}/card.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = await readPdf(res.body as Buffer);
    expect(pdf.text).toContain('T-2024-001');
    expect(pdf.text).toContain('ΔE00');
    expect(pdf.qr).toEqual([trialUrl(trial.id)]);
    expect(pdf.qr[0]).toMatch(new RegExp(`/trials/${trial.id}$`));
    // Every quantity with its unit, % owf also in grams for the card's 250 g: the tannin step as well as the dye bath.
    expect(pdf.text).toContain('tannic acid 8 % owf = 20 g');
    expect(pdf.text).toContain('madder 60 % owf = 150 g');
    expect(pdf.text).toContain('liquor 1:30');
    expect(pdf.text).toContain('250 g dry mass');
    // Its print paste in g/L of paste and grams for the paste volume (17.1 g/L × 0.3 L = 5.13 g), never % owf.
    expect(pdf.text.replace(/\s+/g, ' ')).toMatch(/aluminium acetate \(basic\) 17.1 g\/L of paste = 5.13 g in 300 mL/);
  });

  it('series cards, series labels and batch labels download for staff and not for visitors', async () => {
    const { Trial: T } = await import('../../server/models/index.ts');
    const ws = await T.findOne({ where: { code: 'T-2024-001' }, rejectOnEmpty: true });
    await request(app).get(`/api/trials/${ws.id}/card.pdf`).expect(401);
    const list = (await dyer.get('/api/series').expect(200)).body;
    const demo = list.items.find((s: { code: string }) => s.code === 'WS-2024-01');
    const bin = (url: string) =>
      dyer
        .get(url)
        .buffer(true)
        .parse((r, cb) => {
          const c: Buffer[] = [];
          r.on('data', (x: Buffer) => c.push(x));
          r.on('end', () => cb(null, Buffer.concat(c)));
        });
    const cards = await readPdf((await bin(`/api/series/${demo.id}/cards.pdf`).expect(200)).body);
    expect(cards.qr.length).toBeGreaterThanOrEqual(3);
    // The demo workshop's cells carry their tannin and mordant steps, each amount with its unit and grams for 10 g.
    expect(cards.text).toContain('mordant strong Al (potash alum 15 % owf)');
    expect(cards.text).toContain('mordant-bath: potash alum 15 % owf = 1.5 g');
    expect(cards.text).toContain('tannin: tannic acid 10 % owf = 1 g');
    const labels = await readPdf((await bin(`/api/series/${demo.id}/labels.pdf`).expect(200)).body);
    expect(labels.text).toContain('WS-2024-01');
    const batches = (await dyer.get('/api/batches?pageSize=100').expect(200)).body.items;
    const mb09 = batches.find((b: { code: string }) => b.code === 'MB-09');
    const label = await readPdf((await bin(`/api/batches/${mb09.id}/label.pdf`).expect(200)).body);
    // iron(II) sulfate carries Warning with H302/H315/H319 → exclamation mark (GHS Annex 1, from memory).
    expect(label.text).toContain('WARNING');
    expect(label.text).toContain('GHS07');
    expect(label.text).not.toContain('exclamation mark');
    expect(label.text).toContain('safety data sheet');
    await request(app).get(`/api/series/${demo.id}/cards.pdf`).expect(401);
    await request(app).get(`/api/batches/${mb09.id}/label.pdf`).expect(401);
  });
});
