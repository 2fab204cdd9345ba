import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { fieldErrorsOf, fieldKey } from '../../shared/field-errors.ts';

const schema = z
  .object({
    code: z
      .string()
      .min(1, 'Enter the code')
      .regex(/^[a-z]+$/, 'Letters only'),
    steps: z.array(z.object({ ph: z.number().max(14, 'At most 14') })),
  })
  .refine((v) => v.code !== 'x', { message: 'Not x' });

describe('zod issues → field errors (one function for server and client)', () => {
  it('keys each field by its dotted path, "_" for the whole input, keeping every message or only the first', () => {
    const r = schema.safeParse({ code: '', steps: [{ ph: 20 }] });
    expect(r.success).toBe(false);
    const issues = r.success ? [] : r.error.issues;
    expect(fieldErrorsOf(issues)).toEqual({ code: ['Enter the code', 'Letters only'], 'steps.0.ph': ['At most 14'] });
    expect(fieldErrorsOf(issues, { first: true })).toEqual({ code: ['Enter the code'], 'steps.0.ph': ['At most 14'] });
    const root = schema.safeParse({ code: 'x', steps: [] });
    expect(root.success ? {} : fieldErrorsOf(root.error.issues)).toEqual({ _: ['Not x'] });
    expect(fieldKey([])).toBe('_');
  });
});
