import { stringify, type Options, type Stringifier } from 'csv-stringify';

/**
 * CSV injection (formula injection): a spreadsheet runs a cell that starts with = + - @ (or tab / carriage
 * return, which some spreadsheets skip before one of those) as a formula. The common rule — OWASP "CSV
 * Injection" guidance — is to prefix such a cell with a single quote so it is shown as text.
 * A cell that is a plain decimal number ("-4.9", "-200", "+1e3") is left alone: a spreadsheet reads it as a
 * number, never as a formula, and numeric columns must stay numbers (common practice).
 */
const TRIGGER = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

export function neutraliseCell(value: string): string {
  return TRIGGER.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
}

/** The import's inverse (server/import/csv-file.ts): a quote before a trigger character is taken off again, so exports re-import unchanged. */
export function restoreCell(value: string): string {
  return value.startsWith("'") && TRIGGER.test(value.slice(1)) ? value.slice(1) : value;
}

/** The one CSV writer of every export: csv-stringify with string cells neutralised (numbers pass as numbers). */
export function csvStringifier(options: Options): Stringifier {
  return stringify({ ...options, cast: { ...options.cast, string: neutraliseCell } });
}
