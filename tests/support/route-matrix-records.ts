import { makeAnalysis, makePiece } from '../../server/seed/factories.ts';
import type { Expected, MatrixRow, Who } from './route-matrix.ts';
import { reportPdf, storedReport } from './report-pdf.ts';

// Rows of the role × route matrix for a piece's analyses, condition reports and display periods (issue 19).
const signedIn: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: '2xx', dyer: '2xx' };
const analysts: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: '2xx', dyer: 403 };
const curators: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 };
// Drafts: a visitor may not know they exist.
const readersOfDraft: Record<Who, Expected> = { ...signedIn, visitor: 404 };

const draft = async () => ({ params: { id: (await makePiece({ status: 'draft' })).id } });
const analysisOfDraft = async () => {
  const piece = await makePiece({ status: 'draft' });
  return { params: { id: (await makeAnalysis({ pieceId: piece.id })).id } };
};
const analysisWithReport = async () => {
  const piece = await makePiece({ status: 'published' });
  const { sha256, bytes } = await storedReport();
  const a = await makeAnalysis({ pieceId: piece.id, reportSha256: sha256, reportBytes: bytes, reportName: 'r.pdf' });
  return { params: { id: a.id } };
};
const display = { from: '2024-03-01', to: '2024-03-10', lux: 50, hoursPerDay: 8 };

export const recordRows: MatrixRow[] = [
  { route: 'GET /api/pieces/:id/analyses', expect: readersOfDraft, setup: draft },
  {
    route: 'POST /api/pieces/:id/analyses',
    expect: analysts,
    setup: async () => ({
      ...(await draft()),
      body: {
        method: 'HPLC-DAD',
        site: 'loose thread',
        analysedOn: '2024-05-02',
        findings: [{ substance: 'alizarin', confidence: 'confirmed' }],
      },
    }),
  },
  { route: 'GET /api/analyses/:id', expect: readersOfDraft, setup: analysisOfDraft },
  {
    route: 'PATCH /api/analyses/:id',
    expect: analysts,
    setup: async () => ({ ...(await analysisOfDraft()), body: { laboratory: 'matrix lab' } }),
  },
  { route: 'DELETE /api/analyses/:id', expect: analysts, setup: analysisOfDraft },
  {
    route: 'POST /api/analyses/:id/report',
    expect: analysts,
    setup: async () => ({
      ...(await analysisOfDraft()),
      attach: [{ field: 'report', buffer: await reportPdf(), filename: 'report.pdf' }],
    }),
  },
  { route: 'GET /api/analyses/:id/report', expect: signedIn, setup: analysisWithReport },
  { route: 'GET /api/pieces/:id/condition-reports', expect: signedIn, setup: draft },
  {
    route: 'POST /api/pieces/:id/condition-reports',
    expect: curators,
    setup: async () => ({
      ...(await draft()),
      body: { assessedOn: '2024-02-01', assessor: 'Matrix assessor', state: 'stable' },
    }),
  },
  { route: 'GET /api/pieces/:id/displays', expect: signedIn, setup: draft },
  {
    route: 'POST /api/pieces/:id/displays/check',
    expect: curators,
    setup: async () => ({ ...(await draft()), body: display }),
  },
  {
    route: 'POST /api/pieces/:id/displays',
    expect: curators,
    setup: async () => ({ ...(await draft()), body: display }),
  },
];
