import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

// Curatorial fields of a piece (issue 19): makers, pattern name, marks, storage (staff only), rights URIs.
const app = createApp();
afterAll(() => sequelize.close());

const run = `${Date.now() % 1_000_000}`;
let n = 0;
const accession = () => `2098.${run}.${++n}`;
// Rights URIs as published by Creative Commons and RightsStatements.org (their own pages; IIIF Presentation 3.0 §rights
// names these two families).
const PDM = 'http://creativecommons.org/publicdomain/mark/1.0/';
const CC_BY = 'http://creativecommons.org/licenses/by/4.0/';
const IN_C = 'http://rightsstatements.org/vocab/InC/1.0/';

const curatorial = {
  makers: [
    { name: 'Invented print works', role: 'manufactory', dates: '1768/1791' },
    { name: 'A. Blockcutter', role: 'block cutter', dates: '1741/1802?' },
    { name: 'P. Printer', role: 'printer', dates: null },
  ],
  patternName: 'Pomegranate trail',
  marks: [{ text: 'IPW 1774', kind: 'stamp', place: 'verso, lower left' }],
  storageLocation: 'Store Z, drawer 99',
  objectRights: PDM,
  imageRights: CC_BY,
};

async function publishedPiece() {
  const curator = await signedInAgent(app, 'curator');
  const res = await curator
    .post('/api/pieces')
    .set('Origin', ORIGIN)
    .send({
      accessionNumber: accession(),
      objectName: 'panel',
      title: `Curatorial ${run}-${n}`,
      creditLine: 'Invented gift, 2001',
      status: 'published',
      ...curatorial,
    })
    .expect(201);
  return { curator, piece: res.body.piece };
}

describe('curatorial fields', () => {
  it('a curator records makers, pattern, marks, storage and rights; staff read them all', async () => {
    const { piece } = await publishedPiece();
    expect(piece).toMatchObject(curatorial);
    const researcher = await signedInAgent(app, 'researcher');
    const seen = (await researcher.get(`/api/pieces/${piece.id}`).expect(200)).body.piece;
    expect(seen.storageLocation).toBe('Store Z, drawer 99');
    expect(seen.makers).toHaveLength(3);
  });

  it('never gives the storage location to a visitor', async () => {
    const { piece } = await publishedPiece();
    const res = await request(app).get(`/api/pieces/${piece.id}`).expect(200);
    expect(res.body.piece.patternName).toBe('Pomegranate trail');
    expect('storageLocation' in res.body.piece).toBe(false);
    expect(JSON.stringify(res.body)).not.toContain('drawer 99');
  });

  it('refuses a rights value that is not a Creative Commons or RightsStatements.org URI, with a clear message', async () => {
    const { curator, piece } = await publishedPiece();
    for (const bad of [
      'All rights reserved',
      'https://example.org/licence',
      'http://creativecommons.org/licenses/by/5.0/',
    ]) {
      const res = await curator
        .patch(`/api/pieces/${piece.id}`)
        .set('Origin', ORIGIN)
        .send({ imageRights: bad })
        .expect(400);
      expect(res.body.error.details.fields.imageRights[0]).toMatch(/Creative Commons or RightsStatements\.org URI/);
    }
    for (const good of [IN_C, 'https://creativecommons.org/licenses/by-nc-sa/3.0/de/', null]) {
      // https:// is stored in the publishers' canonical http:// form.
      const res = await curator
        .patch(`/api/pieces/${piece.id}`)
        .set('Origin', ORIGIN)
        .send({ objectRights: good })
        .expect(200);
      expect(res.body.piece.objectRights).toBe(good && good.replace('https://', 'http://'));
    }
  });

  it('checks a maker’s dates as EDTF and its role against the list', async () => {
    const { curator, piece } = await publishedPiece();
    const res = await curator
      .patch(`/api/pieces/${piece.id}`)
      .set('Origin', ORIGIN)
      .send({ makers: [{ name: 'X', role: 'weaver', dates: '1850-02-30' }] })
      .expect(400);
    expect(res.body.error.details.fields['makers.0.role'][0]).toMatch(
      /designer, block cutter, printer, dyer or manufactory/,
    );
    expect(res.body.error.details.fields['makers.0.dates'][0]).toBeTruthy();
    const empty = await curator
      .patch(`/api/pieces/${piece.id}`)
      .set('Origin', ORIGIN)
      .send({ marks: [{ text: '', kind: 'stamp' }] })
      .expect(400);
    expect(empty.body.error.details.fields['marks.0.text'][0]).toMatch(/text of the mark/);
  });

  it('carries the image rights into the IIIF manifest, both rights and the credit line into requiredStatement', async () => {
    const { piece } = await publishedPiece();
    const m = (await request(app).get(`/iiif/${piece.id}/manifest.json`).expect(200)).body;
    const manifest = typeof m === 'object' && m.id ? m : JSON.parse(m.toString());
    expect(manifest.rights).toBe(CC_BY);
    expect(manifest.requiredStatement).toEqual({
      label: { en: ['Credit line'] },
      value: { none: ['Invented gift, 2001', 'Images: CC BY 4.0', 'Object: Public Domain Mark 1.0'] },
    });
    const meta = Object.fromEntries(
      manifest.metadata.map((e: { label: { en: string[] }; value: { none: string[] } }) => [
        e.label.en[0],
        e.value.none[0],
      ]),
    );
    expect(meta['Pattern name']).toBe('Pomegranate trail');
    expect(meta.Makers).toContain('Invented print works (manufactory, 1768/1791)');
    expect(meta['Marks and inscriptions']).toBe('stamp: “IPW 1774” (verso, lower left)');
    expect(JSON.stringify(manifest)).not.toContain('drawer 99');
  });

  it('writes rights, creators and contributors into the Dublin Core record, without the storage location', async () => {
    const { piece } = await publishedPiece();
    const researcher = await signedInAgent(app, 'researcher');
    const dc = JSON.parse((await researcher.get(`/api/pieces/${piece.id}/dublin-core.jsonld`).expect(200)).text);
    expect(dc['dcterms:rights']).toEqual([{ '@id': PDM }, { '@id': CC_BY }, 'Invented gift, 2001']);
    expect(dc['dcterms:creator']).toEqual(['A. Blockcutter (block cutter, 1741/1802?)', 'P. Printer (printer)']);
    expect(dc['dcterms:contributor']).toEqual(['Invented print works (manufactory, 1768/1791)']);
    expect(dc['dcterms:alternative']).toBe('Pomegranate trail');
    expect(JSON.stringify(dc)).not.toContain('drawer 99');
  });
});
