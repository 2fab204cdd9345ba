import sharp from 'sharp';
import type { Transaction } from 'sequelize';
import { ingestPhoto, repalette } from '../media/pipeline.ts';
import { Region, type Piece, type Trial, type User } from '../models/index.ts';
import type { PhotoView } from '../models/catalogue.ts';
import { paintCloth, type Shape } from './cloth-image.ts';

// Demo photos are painted at seed time: each piece's colours as motifs, stripes, spots or
// blocks on its cloth ground, laid on a neutral grey mount, with weave, light fall-off and
// noise, and on some a grey reference card. Small (1200 × 900) so the seed stays quick.

const W = 1200,
  H = 900,
  MOUNT = '#858585',
  CARD = '#a0a0a0',
  MARGIN = 70;

type Layout = 'motifs' | 'stripes' | 'spots' | 'blocks' | 'swatch';
type DemoPhoto = {
  ground: string;
  colours: string[];
  layout: Layout;
  outline?: string;
  view?: PhotoView;
  card?: boolean;
  tint?: [number, number, number];
  caption: string;
};

function shapesFor(p: DemoPhoto): Shape[] {
  const x0 = MARGIN,
    y0 = MARGIN,
    cw = W - 2 * MARGIN,
    ch = H - 2 * MARGIN;
  const n = p.colours.length;
  // A trial swatch lies straight on the mount; a piece has its cloth ground first.
  const shapes: Shape[] = p.layout === 'swatch' ? [] : [{ kind: 'rect', x: x0, y: y0, w: cw, h: ch, colour: p.ground }];
  if (p.layout === 'swatch') {
    shapes.push({ kind: 'rect', x: 260, y: 160, w: 680, h: 580, colour: p.colours[0] });
  } else if (p.layout === 'stripes') {
    for (let i = 0, x = x0 + 40; x < x0 + cw - 40; i++, x += 110)
      shapes.push({ kind: 'rect', x, y: y0, w: i % 2 ? 30 : 55, h: ch, colour: p.colours[i % n] });
  } else if (p.layout === 'blocks') {
    const bw = Math.floor((cw - 40) / n);
    p.colours.forEach((c, i) =>
      shapes.push({ kind: 'rect', x: x0 + 20 + i * bw + 10, y: y0 + 120, w: bw - 20, h: ch - 240, colour: c }),
    );
  } else {
    const cols = p.layout === 'spots' ? 7 : 4,
      rows = p.layout === 'spots' ? 5 : 3;
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < cols; c++) {
        const cx = x0 + ((c + 0.5) * cw) / cols,
          cy = y0 + ((r + 0.5) * ch) / rows;
        const rx = p.layout === 'spots' ? 28 : cw / cols / 3,
          ry = p.layout === 'spots' ? 28 : ch / rows / 3;
        shapes.push({
          kind: 'ellipse',
          cx,
          cy,
          rx,
          ry,
          colour: p.colours[(r * cols + c) % n],
          ...(p.outline ? { outline: { colour: p.outline, width: 4 } } : {}),
        });
      }
    }
  }
  if (p.card)
    shapes.push({ kind: 'rect', x: W - MARGIN - 150, y: H - MARGIN + 8, w: 140, h: MARGIN - 16, colour: CARD });
  return shapes;
}

async function jpegOf(p: DemoPhoto, seed: number) {
  const img = paintCloth({
    width: W,
    height: H,
    ground: MOUNT,
    shapes: shapesFor(p),
    tint: p.tint,
    noise: 3,
    weave: 0.05,
    weavePeriod: 4,
    gradient: 0.03,
    seed,
  });
  return sharp(img.data, { raw: { width: W, height: H, channels: 3 } })
    .jpeg({ quality: 90 })
    .withExif({
      IFD0: { Make: 'Calderwick Museum imaging', Model: 'Copy stand A' },
      IFD2: { DateTimeOriginal: `2024:02:${String(10 + (seed % 18)).padStart(2, '0')} 10:30:00` },
    })
    .toBuffer();
}

const MADDER = { red: '#a23b30', pink: '#d9909a', purple: '#5e3b57', brown: '#6a3b35' };
const GROUND = '#e8dcc3';

const PIECE_PHOTOS: Record<string, DemoPhoto[]> = {
  '1931.4.12': [
    {
      ground: GROUND,
      colours: [MADDER.red, MADDER.pink, MADDER.purple, '#3a4f7a', '#6f8b3c'],
      layout: 'motifs',
      outline: '#2f2a33',
      card: true,
      tint: [1.06, 1, 0.9],
      caption: 'Recto under the copy stand, grey card bottom right',
    },
    {
      ground: GROUND,
      colours: [MADDER.red, '#6f8b3c'],
      layout: 'blocks',
      view: 'detail',
      caption: 'Detail of the pomegranate',
    },
  ],
  '1958.22.4': [{ ground: '#2b3a5e', colours: ['#dcd8cc', '#7d93b5'], layout: 'motifs', card: true, caption: 'Recto' }],
  '1996.9.6': [
    { ground: '#e6dcc0', colours: ['#4f7a3a', '#c9a53a'], layout: 'spots', caption: 'Recto, trellis and dots' },
  ],
  '1931.4.13a-b': [
    {
      ground: '#eadfc8',
      colours: ['#a8342d', '#5a3a2a', '#5d7c3e', '#3d5a8a'],
      layout: 'motifs',
      outline: '#3a2d28',
      caption: 'Curtain a, recto',
    },
  ],
  '1962.3.1': [{ ground: '#a5282a', colours: ['#ece6da'], layout: 'spots', caption: 'Recto' }],
  '1975.40.2': [{ ground: '#4a3026', colours: ['#d48d95', '#eadfc8'], layout: 'motifs', caption: 'Recto' }],
  '1988.12.7': [
    {
      ground: '#efe9dc',
      colours: ['#a893b5', '#6e4651', '#b9a2c4'],
      layout: 'blocks',
      card: true,
      caption: 'The card, both grounds',
    },
  ],
  '2003.5.1': [{ ground: '#d7a86e', colours: ['#8a5a3a', '#f0e6d0'], layout: 'stripes', caption: 'Recto' }],
  '2011.8.3': [{ ground: '#9a8d70', colours: ['#6c6a35', '#e3d9bd'], layout: 'stripes', caption: 'Border, recto' }],
  '1931.4.20': [{ ground: '#ebe1cc', colours: ['#5b3a55', '#6b8a3a'], layout: 'spots', caption: 'Recto' }],
  '2019.1.1': [
    {
      ground: '#efe8da',
      colours: [MADDER.red, MADDER.pink, MADDER.purple, MADDER.brown, '#b0463a', '#e0a3a8'],
      layout: 'blocks',
      card: true,
      caption: 'Six madder shades',
    },
  ],
};

/** Swatch colours of finished trials, by trial code. */
const TRIAL_SWATCHES: Record<string, string> = {
  'T-2024-001': '#9f3a33',
  'T-2024-002': '#d4939a',
  'T-2024-003': '#60405a',
  'T-2024-005': '#5a7d45',
  'T-2024-006': '#2f4169',
};

async function addPhoto(
  t: Transaction,
  actor: User,
  p: DemoPhoto,
  seed: number,
  target: { pieceId?: number; trialId?: number },
) {
  const { photo } = await ingestPhoto({
    actor,
    transaction: t,
    input: { buffer: await jpegOf(p, seed), originalName: `demo-${seed}.jpg`, view: p.view ?? 'recto', ...target },
  });
  await photo.update({ caption: p.caption }, { transaction: t });
  if (p.card) {
    await Region.create(
      {
        photoId: photo.id,
        x: W - MARGIN - 150,
        y: H - MARGIN + 8,
        w: 140,
        h: MARGIN - 16,
        purpose: 'reference-patch',
        label: 'grey card',
        createdById: actor.id,
      },
      { transaction: t },
    );
    await repalette({ transaction: t, photo });
  }
  return photo;
}

/** Photos for every demo piece and a swatch photo for finished trials, through the real pipeline. */
export async function seedDemoPhotos(
  t: Transaction,
  { pieces, trials, curator, dyer }: { pieces: Record<string, Piece>; trials: Trial[]; curator: User; dyer: User },
) {
  let seed = 1;
  for (const [accession, photos] of Object.entries(PIECE_PHOTOS)) {
    const piece = pieces[accession];
    if (!piece) continue;
    for (const p of photos) await addPhoto(t, curator, p, seed++, { pieceId: piece.id });
  }
  for (const trial of trials) {
    const colour = TRIAL_SWATCHES[trial.code];
    if (!colour || trial.status !== 'finished') continue;
    await addPhoto(
      t,
      dyer,
      {
        ground: MOUNT,
        colours: [colour],
        layout: 'swatch',
        view: 'swatch',
        card: true,
        caption: `Swatch of ${trial.code}`,
      },
      seed++,
      { trialId: trial.id },
    );
  }
}
