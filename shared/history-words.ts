import { FIELD_LABELS, type PieceCsvField } from './schemas/piece-import.ts';

// A piece's history in words ("reference patch set", "region ‘ground red’ added"), never field names.
export type HistoryEntry = { action: string; changes: Record<string, { from: unknown; to: unknown }> };

const PURPOSE_WORDS: Record<string, string> = {
  'colour-area': 'colour area',
  motif: 'motif',
  exclusion: 'exclusion',
  'reference-patch': 'reference patch',
  'sampling-site': 'sampling site',
};
const PHOTO_FIELDS: Record<string, string> = { caption: 'caption', view: 'view' };

const list = (words: string[]) =>
  words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
const fieldWords = (keys: string[], labels: Record<string, string>) =>
  list(
    keys
      .filter((k) => k !== 'photoId')
      .map((k) => (labels[k] ?? k.replace(/([A-Z])/g, ' $1')).replace(/^\w/, (c) => c.toLowerCase())),
  );

function regionName(r: unknown): string {
  const region = (r ?? {}) as { label?: string | null; purpose?: string };
  const kind = PURPOSE_WORDS[region.purpose ?? ''] ?? 'region';
  return region.label ? `${kind} ‘${region.label}’` : kind;
}

/** " ‘seam allowance’ (spectrum)", " (L*a*b*)": which reading of the original. */
function readingName(r: unknown): string {
  const m = (r ?? {}) as { label?: string | null; spectral?: boolean };
  return `${m.label ? ` ‘${m.label}’` : ''} (${m.spectral ? 'spectrum' : 'L*a*b*'})`;
}

function analysisName(a: unknown): string {
  const x = (a ?? {}) as { method?: string; analysedOn?: string };
  return `an analysis${x.method ? ` (${x.method}${x.analysedOn ? `, ${x.analysedOn}` : ''})` : ''}`;
}

/** What happened, in a sentence fragment that follows the person's name. */
export function describeHistory(e: HistoryEntry): string {
  const c = e.changes ?? {};
  switch (e.action) {
    case 'create':
      return 'catalogued the piece';
    case 'update': {
      const keys = Object.keys(c);
      return keys.length
        ? `changed the ${fieldWords(keys, FIELD_LABELS as Record<PieceCsvField, string>)}`
        : 'edited the record';
    }
    case 'publish':
      return 'published the piece';
    case 'unpublish':
      return 'returned the piece to draft';
    case 'delete':
      return 'deleted the piece';
    case 'restore':
      return 'restored the piece';
    case 'photo-added':
      return 'added a photo';
    case 'photo-updated':
      return `changed a photo’s ${fieldWords(Object.keys(c), PHOTO_FIELDS)}`;
    case 'photo-removed':
      return 'removed a photo';
    case 'photo-ingest-retried':
      return 'started processing a photo again after it failed';
    case 'region-added':
      return `${regionName(c.region?.to)} added`;
    case 'region-changed': {
      const from = regionName(c.region?.from);
      const to = regionName(c.region?.to);
      return from === to ? `${to} changed` : `${from} changed to ${to}`;
    }
    case 'region-removed':
      return `${regionName(c.region?.from)} removed`;
    case 'reference-patch-set':
      return 'reference patch set';
    case 'reference-patch-cleared':
      return 'reference patch cleared';
    case 'chart-set':
      return c.chart?.from ? 'colour chart marked again' : 'colour chart marked';
    case 'reading-added':
      return `reading of the original added${readingName(c.reading?.to)}`;
    case 'reading-removed':
      return `reading of the original removed${readingName(c.reading?.from)}`;
    case 'fading-pair-added':
      return 'fading pair added';
    case 'fading-pair-removed':
      return 'fading pair removed';
    case 'chart-cleared':
      return 'colour chart removed';
    case 'chart-tolerances-set':
      return 'imaging tolerance levels changed';
    case 'palette-background': {
      const [key, change] = Object.entries(c)[0] ?? [];
      const colour = key?.replace(/^colour /, '') ?? 'a colour';
      return change?.to ? `colour ${colour} marked as background` : `colour ${colour} counted as cloth again`;
    }
    case 'analysis-added':
      return `recorded ${analysisName(c.analysis?.to)}`;
    case 'analysis-changed':
      return `changed ${analysisName(c.analysis?.to)}`;
    case 'analysis-report':
      return `attached the report of ${analysisName(c.analysis?.to)}`;
    case 'analysis-removed':
      return `removed ${analysisName(c.analysis?.from)}`;
    case 'condition-reported': {
      const r = (c.condition?.to ?? {}) as { assessedOn?: string; state?: string };
      return `reported the condition${r.assessedOn ? ` on ${r.assessedOn}` : ''}${r.state ? `: ${r.state}` : ''}`;
    }
    case 'display-logged': {
      const d = (c.display?.to ?? {}) as { from?: string; to?: string; lux?: number; overAllowance?: boolean };
      const over = d.overAllowance ? ', over the annual light allowance' : '';
      return `logged a display from ${d.from} to ${d.to} at ${d.lux} lux${over}`;
    }
    default:
      return e.action.replace(/-/g, ' ');
  }
}
