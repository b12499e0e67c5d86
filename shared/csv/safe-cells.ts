import Papa from 'papaparse';

/**
 * Spreadsheet programs run a cell that starts with `=`, `+`, `-` or `@` (and some with a tab
 * or carriage return) as a formula. Exported cells of that kind are prefixed with `'` so they
 * open as text; plain numbers such as `-20` or `+1.5e3` are left alone. (Common practice:
 * the usual defence against CSV formula injection.)
 */
const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

export function neutraliseCsvCell<T>(value: T): T | string {
  if (typeof value !== 'string') return value;
  if (!FORMULA_START.test(value) || PLAIN_NUMBER.test(value)) return value;
  return `'${value}`;
}

/** Every cell of rows given as arrays or as objects (header → value). */
export function neutraliseCsvRows<R extends readonly unknown[] | Record<string, unknown>>(rows: readonly R[]): R[] {
  return rows.map((row) =>
    Array.isArray(row)
      ? (row.map((c: unknown) => neutraliseCsvCell(c)) as unknown as R)
      : (Object.fromEntries(Object.entries(row).map(([k, v]) => [k, neutraliseCsvCell(v)])) as R),
  );
}

/**
 * CSV text for a download made in the browser: papaparse's unparse over neutralised cells
 * (header names too). Pass `columns` to fix the column order of object rows.
 */
export function toSafeCsv(rows: readonly (readonly unknown[] | Record<string, unknown>)[], opts: { columns?: readonly string[]; header?: readonly string[] } = {}): string {
  const safe = neutraliseCsvRows(rows);
  if (opts.header) {
    return Papa.unparse({ fields: opts.header.map((h) => String(neutraliseCsvCell(h))), data: safe as unknown[][] }, { newline: '\r\n' });
  }
  return Papa.unparse(safe as object[], {
    newline: '\r\n',
    ...(opts.columns ? { columns: opts.columns.map((c) => c) } : {}),
  });
}
