import { z } from 'zod';
import '../messages.ts';
import { SPECTRAL_ILLUMINANTS, SPECTRAL_OBSERVERS, SPECTRAL_INTERVALS } from '../colour/spectral-words.ts';

// Reflectance spectra and what is computed from them (shared/colour/spectral.ts, metamerism.ts,
// shared/compute/grey-scale.ts). A spectrum runs from 360–400 nm to 700–780 nm in steps of 1, 5,
// 10 or 20 nm; values are fractions 0–1 or percentages 0–100 (read as percentages when any is
// above 1.5, or as the `unit` says). Fluorescent whites may reflect a little over 100 %, so up to
// 150 % is taken.

export const START_NM = { min: 360, max: 400 } as const;
export const END_NM = { min: 700, max: 780 } as const;
export const MAX_PERCENT = 150;

const intervalWords = SPECTRAL_INTERVALS.join(', ').replace(/, (\d+)$/, ' or $1');

export const spectrumSchema = z
  .object({
    startNm: z
      .number({ error: 'Enter the first wavelength in nm, from 360 to 400' })
      .int('The first wavelength must be a whole number of nm')
      .min(START_NM.min, 'The first wavelength must be 360–400 nm')
      .max(START_NM.max, 'The first wavelength must be 360–400 nm'),
    intervalNm: z
      .number({ error: `Enter the step between wavelengths: ${intervalWords} nm` })
      .refine((v) => (SPECTRAL_INTERVALS as readonly number[]).includes(v), {
        message: `The step between wavelengths must be ${intervalWords} nm`,
      }),
    values: z
      .array(z.number({ error: 'Every reflectance value must be a number' }), {
        error: 'Enter the reflectance values, one per wavelength',
      })
      .min(2, 'Enter the reflectance values, one per wavelength')
      .max(421, 'A spectrum has at most 421 values (360–780 nm at 1 nm)'),
    unit: z.enum(['fraction', 'percent'], { error: 'Choose fractions (0–1) or percent' }).optional(),
  })
  .superRefine((s, ctx) => {
    if (!(SPECTRAL_INTERVALS as readonly number[]).includes(s.intervalNm) || !Number.isInteger(s.startNm)) return;
    const n = s.values.length;
    const end = s.startNm + s.intervalNm * (n - 1);
    if (end < END_NM.min || end > END_NM.max) {
      const fewest = Math.ceil((END_NM.min - s.startNm) / s.intervalNm) + 1;
      const most = Math.floor((END_NM.max - s.startNm) / s.intervalNm) + 1;
      ctx.addIssue({
        code: 'custom',
        path: ['values'],
        message: `From ${s.startNm} nm every ${s.intervalNm} nm, a spectrum ending at 700–780 nm has ${fewest} to ${most} values; these ${n} end at ${end} nm`,
      });
    }
    const percent = s.unit ? s.unit === 'percent' : s.values.some((v) => v > 1.5);
    const max = percent ? MAX_PERCENT : 1.5;
    const bad = s.values.findIndex((v) => v < 0 || v > max);
    if (bad >= 0) {
      const nm = s.startNm + s.intervalNm * bad;
      ctx.addIssue({
        code: 'custom',
        path: ['values'],
        message:
          s.values[bad] < 0
            ? `Reflectance cannot be negative: ${s.values[bad]} at ${nm} nm`
            : `Reflectance must be 0–1 or 0–${MAX_PERCENT} %: ${s.values[bad]} at ${nm} nm`,
      });
    }
  });
export type SpectrumInput = z.input<typeof spectrumSchema>;

export const spectralIlluminant = z.enum(SPECTRAL_ILLUMINANTS, {
  error: `Choose an illuminant: ${SPECTRAL_ILLUMINANTS.join(', ')}`,
});
export const spectralObserver = z.enum(SPECTRAL_OBSERVERS, { error: 'Choose the 2° or the 10° observer' });

export const spectrumRequest = z.object({
  spectrum: spectrumSchema,
  illuminant: spectralIlluminant.default('D65'),
  observer: spectralObserver.default('10'),
});
export const metamerismRequest = z.object({
  reference: spectrumSchema,
  sample: spectrumSchema,
  observer: spectralObserver.default('10'),
});

const xyz = z.object({ X: z.number(), Y: z.number(), Z: z.number() });
const lab = z.object({ L: z.number(), a: z.number(), b: z.number() });

export const spectrumAnswer = z.object({
  illuminant: spectralIlluminant,
  observer: spectralObserver,
  /** Tristimulus values, the perfect white's Y = 100. */
  XYZ: xyz,
  white: xyz,
  lab,
  method: z.string(),
});
export type SpectrumAnswer = z.infer<typeof spectrumAnswer>;

export const metamerismRow = z.object({
  illuminant: spectralIlluminant,
  deltaE00: z.number(),
  corrected: z.number().nullable(),
  words: z.array(z.string()),
});
export const metamerismAnswer = z.object({
  observer: spectralObserver,
  referenceIlluminant: spectralIlluminant,
  byIlluminant: z.array(metamerismRow),
  worst: z.object({ illuminant: spectralIlluminant, deltaE00: z.number() }),
  index: z.number().nullable(),
  indexIlluminant: spectralIlluminant.nullable(),
  summary: z.string(),
});
export type MetamerismAnswer = z.infer<typeof metamerismAnswer>;

z.globalRegistry.add(spectrumSchema, { id: 'Spectrum' });
