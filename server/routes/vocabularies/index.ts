import { Router } from 'express';
import type { Vocabularies } from '../../../shared/schemas/vocabularies.ts';
import { Chemical, Dyestuff, VocabularyTerm } from '../../models/index.ts';

/** The terms the catalogue forms offer: fibres, weaves, techniques, dyestuffs and mordant chemicals. */
export const vocabulariesRouter = Router();

vocabulariesRouter.get('/', async (_req, res) => {
  const [terms, dyestuffs, mordants] = await Promise.all([
    VocabularyTerm.findAll({ order: [['id', 'ASC']] }),
    Dyestuff.findAll({ order: [['name', 'ASC']] }),
    Chemical.findAll({ where: { role: 'mordant' }, order: [['name', 'ASC']] }),
  ]);
  const of = (v: string) => terms.filter((t) => t.vocabulary === v).map((t) => ({ term: t.term, note: t.note }));
  const body: Vocabularies = {
    fibres: of('fibre'),
    weaves: of('weave'),
    techniques: of('technique'),
    dyestuffs: dyestuffs.map((d) => ({ name: d.name, ciName: d.ciName })),
    mordants: mordants.map((c) => ({
      name: c.name,
      formula: c.formula,
      status: c.status,
      signalWord: c.signalWord,
      hStatements: c.hStatements,
      ppe: c.ppe,
    })),
  };
  res.json(body);
});
