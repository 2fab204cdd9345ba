import { healthBench } from './health.bench.ts';
import { importBench } from './import.bench.ts';
import { ingestBench } from './ingest.bench.ts';
import { loadBench } from './load.bench.ts';
import { paletteBench } from './palette.bench.ts';
import { searchBench } from './search.bench.ts';
import { startupBench } from './startup.bench.ts';
import { suggestBench } from './suggest.bench.ts';
import { importStreamBench, uploadStreamBench } from './streaming.bench.ts';

export type BenchResult = { metric: string; value: number; unit: string; target?: string; pass?: boolean };
export type Bench = { name: string; run: () => Promise<BenchResult[]> };

// Each benchmark registers here.
export const benches: Bench[] = [
  healthBench,
  importBench,
  importStreamBench,
  uploadStreamBench,
  ingestBench,
  paletteBench,
  searchBench,
  startupBench,
  loadBench,
  suggestBench,
];
