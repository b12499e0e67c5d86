/**
 * Spreadsheet formula injection: a text cell starting with = + - @ (or tab / carriage return)
 * may be run as a formula when an exported CSV is opened. Such cells get a leading apostrophe so
 * they are shown as text. Numbers are left alone (a negative margin stays a number).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/** One cell made safe for a CSV opened in a spreadsheet. */
export function neutraliseCell<T>(value: T): T | string {
  if (typeof value !== 'string') return value;
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/** Every text cell of a row made safe (see `neutraliseCell`). */
export function neutraliseRow(row: readonly unknown[]): unknown[] {
  return row.map((c) => neutraliseCell(c));
}
