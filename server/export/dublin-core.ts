import type { Piece } from '../models/index.ts';

// Dublin Core terms (DCMI Metadata Terms, https://www.dublincore.org/specifications/dublin-core/dcmi-terms/) in JSON-LD 1.1.
const evidenced = (list: Array<{ name: string; evidence: string }>) => list.map((t) => `${t.name} (${t.evidence})`);

const makerText = (m: { name: string; role: string; dates: string | null }) =>
  `${m.name} (${m.role}${m.dates ? `, ${m.dates}` : ''})`;

function rightsValues(piece: Piece) {
  const values = [
    ...(piece.objectRights ? [{ '@id': piece.objectRights }] : []),
    ...(piece.imageRights && piece.imageRights !== piece.objectRights ? [{ '@id': piece.imageRights }] : []),
    ...(piece.creditLine ? [piece.creditLine] : []),
  ];
  return values.length === 1 ? values[0] : values;
}

export function dublinCore(base: string, piece: Piece) {
  const extent = [
    piece.heightMm != null && piece.widthMm != null ? `${piece.heightMm} × ${piece.widthMm} mm (height × width)` : null,
    piece.repeatMm != null ? `repeat ${piece.repeatMm} mm` : null,
  ].filter(Boolean);
  const doc: Record<string, unknown> = {
    '@context': {
      dcterms: 'http://purl.org/dc/terms/',
      xsd: 'http://www.w3.org/2001/XMLSchema#',
      edtf: 'http://id.loc.gov/datatypes/edtf/',
    },
    '@id': `${base}/api/pieces/${piece.id}/dublin-core.jsonld`,
    '@type': 'dcterms:PhysicalResource',
    'dcterms:identifier': piece.accessionNumber,
    'dcterms:title': piece.title,
    'dcterms:type': piece.objectName,
    'dcterms:description': piece.description ?? undefined,
    'dcterms:date': piece.dateText ?? undefined,
    'dcterms:created': piece.dateEdtf ? { '@value': piece.dateEdtf, '@type': 'edtf:EDTF' } : undefined,
    'dcterms:temporal':
      piece.earliestYear != null || piece.latestYear != null
        ? `${piece.earliestYear ?? '..'}/${piece.latestYear ?? '..'}`
        : undefined,
    'dcterms:spatial': piece.place ?? undefined,
    'dcterms:medium': [...piece.fibres, ...evidenced(piece.dyestuffs), ...evidenced(piece.historicalMordants)],
    'dcterms:subject': piece.techniques,
    'dcterms:extent': extent.length ? extent.join('; ') : undefined,
    'dcterms:provenance': piece.provenance ?? undefined,
    // dc:rights holds the rights URIs (as IRIs) and the credit line; makers are creators, except a manufactory, which
    // is the contributor in whose works the piece was made. storageLocation is never here: the record is public.
    'dcterms:rights': rightsValues(piece),
    'dcterms:creator': (piece.makers ?? []).filter((m) => m.role !== 'manufactory').map(makerText),
    'dcterms:contributor': (piece.makers ?? []).filter((m) => m.role === 'manufactory').map(makerText),
    'dcterms:alternative': piece.patternName ?? undefined,
    'dcterms:hasFormat': piece.status === 'published' ? `${base}/iiif/${piece.id}/manifest.json` : undefined,
    'dcterms:modified': { '@value': new Date(piece.updatedAt).toISOString(), '@type': 'xsd:dateTime' },
  };
  for (const [k, v] of Object.entries(doc)) if (v === undefined || (Array.isArray(v) && v.length === 0)) delete doc[k];
  return doc;
}
