import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The forms' convention checks itself (DEVELOPERS.md, "Forms"): every <form> under client/ goes
// through useFormErrors() from client/lib/form.ts, and only that file turns zod issues into messages.
// A plain source scan: it reads the client's files as text and runs none of them.

const root = join(import.meta.dirname, '../../client');
const HELPER = 'lib/form.ts';

function sources(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    if (e.isDirectory()) return e.name === 'public' ? [] : sources(path);
    return /\.tsx?$/.test(e.name) ? [path] : [];
  });
}
const files = sources(root).map((path) => ({
  name: relative(root, path).replaceAll('\\', '/'),
  text: readFileSync(path, 'utf8'),
}));
// Comments may name a <form> or zod's issues without being one.
const code = (text: string) => text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');

describe('the forms’ convention', () => {
  it('finds the client’s forms (the scan reads something)', () => {
    expect(files.some((f) => f.name === HELPER)).toBe(true);
    expect(files.filter((f) => /<form\b/.test(code(f.text))).length).toBeGreaterThan(15);
  });

  it('every component with a <form> uses useFormErrors()', () => {
    const without = files
      .filter((f) => /<form\b/.test(code(f.text)) && !/\buseFormErrors\(\)/.test(code(f.text)))
      .map((f) => f.name);
    expect(without, 'a <form> that does not validate through useFormErrors() from client/lib/form.ts').toEqual([]);
  });

  it('only client/lib/form.ts turns zod issues into field messages', () => {
    const ISSUES =
      /\.issues\b|\.flatten\(|\bflattenError\(|\btreeifyError\(|\bprettifyError\(|\.format\(\)\s*\._errors|\bfieldErrorsOf\(/;
    const others = files.filter((f) => f.name !== HELPER && ISSUES.test(code(f.text))).map((f) => f.name);
    expect(others, 'use check(), fromServer() or errorsFor() from client/lib/form.ts').toEqual([]);
  });

  it('the scan would catch a hand-rolled form', () => {
    const handRolled = `export function F() { const [e, setE] = useState({}); return <form onSubmit={() => setE(schema.safeParse(v).error.issues)} />; }`;
    expect(/<form\b/.test(code(handRolled)) && !/\buseFormErrors\(\)/.test(code(handRolled))).toBe(true);
  });
});
