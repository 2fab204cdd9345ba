import sharp from 'sharp';
import type { Bench, BenchResult } from './index.ts';

const RUNS = 7;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/**
 * Palette and pipeline speed on a generated 24-megapixel JPEG, against the time sharp needs
 * just to decode it with shrink-on-load to about 256 px, measured in the same run.
 * Targets (issue 4): palette ≤ 1.5× that decode, whole pipeline < 3×.
 */
export const paletteBench: Bench = {
  name: 'palette',
  async run() {
    const { migrate } = await import('../../server/db/setup.ts');
    const { sequelize } = await import('../../server/models/index.ts');
    const { paintCloth } = await import('../../server/seed/cloth-image.ts');
    const { workingImage } = await import('../../server/media/decode.ts');
    const { extractPalette } = await import('../../server/media/palette.ts');
    const { ingestPhoto, removePhotoFiles } = await import('../../server/media/pipeline.ts');
    await migrate();

    const W = 6000,
      H = 4000;
    const shapes = [];
    for (let i = 0; i < 24; i++) {
      const cx = ((i % 6) + 0.5) * (W / 6),
        cy = (Math.floor(i / 6) + 0.5) * (H / 4);
      shapes.push({
        kind: 'ellipse' as const,
        cx,
        cy,
        rx: W / 16,
        ry: H / 10,
        colour: ['#9e2a2b', '#d98c95', '#5b3a55', '#2e3f66'][i % 4],
        outline: { colour: '#2a2630', width: W / 300 },
      });
    }
    const cloth = paintCloth({
      width: W,
      height: H,
      ground: '#e6d9bf',
      shapes,
      noise: 4,
      weave: 0.05,
      gradient: 0.03,
      seed: 1,
    });
    const jpeg = await sharp(cloth.data, { raw: { width: W, height: H, channels: 3 } })
      .jpeg({ quality: 90 })
      .toBuffer();

    const baseline = async () => {
      await sharp(jpeg).resize({ width: 256, height: 256, fit: 'inside' }).raw().toBuffer();
    };
    const palette = async () => {
      extractPalette(await workingImage(jpeg));
    };
    // The pipeline runs in a transaction that is then rolled back; its files are removed after timing.
    let ingested: Awaited<ReturnType<typeof ingestPhoto>>['photo'] | null = null;
    const cleanUp = async () => {
      if (ingested) await removePhotoFiles(ingested);
      ingested = null;
    };
    const pipeline = async () => {
      await sequelize
        .transaction(async (transaction) => {
          ingested = (await ingestPhoto({ actor: null, transaction, input: { buffer: jpeg } })).photo;
          throw new Error('rollback');
        })
        .catch(() => undefined);
    };
    const times: Record<string, number[]> = { baseline: [], palette: [], pipeline: [] };
    const steps: Array<[string, () => Promise<void>]> = [
      ['baseline', baseline],
      ['palette', palette],
      ['pipeline', pipeline],
    ];
    for (const [, f] of steps) await f(); // warm-up (JIT, libvips caches)
    await cleanUp();
    for (let i = 0; i < RUNS; i++) {
      // Interleaved, so all three see the same machine load.
      for (const [name, f] of steps) {
        const t = performance.now();
        await f();
        times[name].push(performance.now() - t);
        await cleanUp();
      }
    }
    await sequelize.close();
    const base = median(times.baseline),
      pal = median(times.palette),
      pipe = median(times.pipeline);
    const results: BenchResult[] = [
      { metric: 'decode 24 MP JPEG to 256 px (median)', value: base, unit: 'ms' },
      { metric: 'palette extraction (median)', value: pal, unit: 'ms' },
      { metric: 'palette / decode', value: pal / base, unit: '×', target: '≤ 1.5', pass: pal / base <= 1.5 },
      { metric: 'whole pipeline (median)', value: pipe, unit: 'ms' },
      { metric: 'pipeline / decode', value: pipe / base, unit: '×', target: '< 3', pass: pipe / base < 3 },
    ];
    return results;
  },
};
