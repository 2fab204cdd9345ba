import { describe, expect, it } from 'vitest';
import { neutraliseCell, restoreCell } from '../../server/export/csv.ts';

// OWASP "CSV Injection": cells starting with = + - @ tab or carriage return are prefixed with a single quote.
describe('CSV cells are neutralised against formula injection', () => {
  it.each(['=1+2', '+SUM(A1)', '-2+3+cmd|" /C calc"!A0', '@SUM(1)', '\t=1', '\r=1', '-torn'])('quotes %j', (v) => {
    expect(neutraliseCell(v)).toBe(`'${v}`);
    expect(restoreCell(neutraliseCell(v))).toBe(v);
  });
  it.each(['-4.9', '-200', '+1e3', '-.5', 'madder', '', "'quoted", '4-5'])('leaves %j as it is', (v) => {
    expect(neutraliseCell(v)).toBe(v);
  });
});
