import { mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Bench, BenchResult } from './index.ts';
import { loadAverage, serverWithCurator, watch } from './streaming.bench.ts';
import { writeTiff } from '../support/tiff-writer.ts';

/**
 * Issue 18 point 1, large masters: a 16-bit, 100-megapixel TIFF of about 300 MB (12 000 × 8 400 px, Deflate, made
 * here strip by strip in a temp folder: four dyed colours in 512 px checks with noise in the low 5 bits, which
 * keeps it from compressing to nothing) uploaded through POST /api/pieces/:id/photos to a separate app server process
 * (server/index.ts, as in production), whose RSS is read from /proc every 50 ms (streaming.bench.ts).
 * Target: peak RSS < 600 MB above idle while ingesting. The deep-zoom tiles are built afterwards by the same
 * server's job worker; their time and memory are printed too (no target). Figures only, no timed assertion; note
 * the load average printed beside them.
 */
const WIDTH = 12_000;
const HEIGHT = 8_400;
const COLOURS = [
  [0xa0, 0x30, 0x28],
  [0x30, 0x50, 0x90],
  [0xd8, 0xc8, 0xa0],
  [0x40, 0x70, 0x40],
];

export const ingestBench: Bench = {
  name: 'ingest',
  async run() {
    const { makePiece } = await import('../../server/seed/factories.ts');
    const { PaletteColour, Photo } = await import('../../server/models/index.ts');
    const dir = await mkdtemp(path.join(tmpdir(), 'bench-ingest-'));
    const file = path.join(dir, 'master-16bit-100mp.tif');
    let seed = 2463534242;
    const t0 = performance.now();
    writeTiff(file, {
      width: WIDTH,
      height: HEIGHT,
      bits: 16,
      compression: 'deflate',
      row: (y, out) => {
        for (let x = 0; x < WIDTH; x++) {
          const c = COLOURS[((x >> 9) + (y >> 9)) & 3];
          for (let k = 0; k < 3; k++) {
            // xorshift32 (Marsaglia 2003): cheap noise for the low bits.
            seed ^= seed << 13;
            seed ^= seed >>> 17;
            seed ^= seed << 5;
            out[x * 3 + k] = (c[k] << 8) | (seed & 0x1f);
          }
        }
      },
    });
    const made = (performance.now() - t0) / 1000;
    const bytes = (await stat(file)).size;
    const { server, agent, pid, close } = await serverWithCurator();
    try {
      const piece = await makePiece({ status: 'draft' });
      const load = loadAverage();
      // Idle: the server has started and answered a sign-in.
      const stopIngest = watch(server.url, pid);
      const t1 = performance.now();
      const res = await agent
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', server.url)
        .attach('photo', file, { filename: 'master-16bit-100mp.tif', contentType: 'image/tiff' });
      const ingestSeconds = (performance.now() - t1) / 1000;
      const w = await stopIngest();
      if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${res.text.slice(0, 300)}`);
      const photoId = res.body.photos[0].id as number;

      // EXIF, previews, palette and tiles: the ingest job, run by the server's worker after the upload's commit.
      const stopTiles = watch(server.url, pid);
      const t2 = performance.now();
      let status = 'queued';
      while (status !== 'done' && status !== 'failed' && status !== 'gone') {
        await new Promise((r) => setTimeout(r, 250));
        status = (await Photo.findByPk(photoId))?.ingestStage ?? 'gone';
      }
      const tileSeconds = (performance.now() - t2) / 1000;
      const tw = await stopTiles();
      const palette = await PaletteColour.findAll({ where: { photoId, regionId: null, variant: 'raw' } });
      return [
        { metric: `test file: ${WIDTH} × ${HEIGHT} px, 16-bit RGB TIFF, Deflate`, value: bytes / 1e6, unit: 'MB' },
        { metric: 'time to write the test file', value: made, unit: 's' },
        { metric: 'upload: check, hash and store the master (answered 201)', value: ingestSeconds, unit: 's' },
        { metric: 'server RSS at idle', value: w.baseMb, unit: 'MB' },
        {
          metric: 'server RSS above idle while uploading (peak, sampled every 50 ms)',
          value: w.growthMb,
          unit: 'MB',
          target: '< 600 MB',
          pass: w.growthMb < 600,
        },
        { metric: 'of which anonymous memory (RssAnon)', value: w.anonGrowthMb, unit: 'MB' },
        { metric: 'worst GET /api/health while uploading', value: w.worstHealth, unit: 'ms' },
        { metric: 'palette colours found', value: palette.length, unit: 'colours' },
        {
          metric: `ingest job afterwards: EXIF, previews, palette, tiles (ended ${status})`,
          value: tileSeconds,
          unit: 's',
          target: 'done',
          pass: status === 'done',
        },
        {
          metric: 'server RSS above idle during the ingest job (peak)',
          value: tw.baseMb + tw.growthMb - w.baseMb,
          unit: 'MB',
          target: '< 600 MB',
          pass: tw.baseMb + tw.growthMb - w.baseMb < 600,
        },
        { metric: 'load average (1 min) at start', value: load, unit: '' },
      ] satisfies BenchResult[];
    } finally {
      await rm(dir, { recursive: true, force: true });
      await server.stop();
      await close();
    }
  },
};
