import { formatPath, spoolDocumentSchema, type SpoolDocument } from '../../shared/model/spool';
import type { CsvRow } from '../csv';
import { createSlicer } from '../yield';

/** A problem in an uploaded CSV: the file line (header = 1), the column and what is wrong. */
export interface CsvIssue {
  line: number;
  column: string | null;
  /** `line 4: pressure` — the same `{ path, message }` shape as other validation errors. */
  path: string;
  message: string;
}

/** Most data rows one line-list import may hold. */
export const LINE_LIST_MAX_ROWS = 2_000;

const key = (h: string) => h.toLowerCase().replace(/[\s_\-()]/g, '');

/** Line-list columns and where each goes in the document. */
const COLUMNS: Record<string, { field: string; numeric: boolean; target: 'doc' | 'conditions' }> = {
  name: { field: 'name', numeric: false, target: 'doc' },
  line: { field: 'line', numeric: false, target: 'doc' },
  units: { field: 'units', numeric: false, target: 'doc' },
  pressure: { field: 'pressure', numeric: true, target: 'conditions' },
  temperature: { field: 'temperature', numeric: true, target: 'conditions' },
  externalpressure: { field: 'externalPressure', numeric: true, target: 'conditions' },
  material: { field: 'material', numeric: false, target: 'conditions' },
  allowablestress: { field: 'allowableStress', numeric: true, target: 'conditions' },
  qualityfactor: { field: 'qualityFactor', numeric: true, target: 'conditions' },
  productform: { field: 'productForm', numeric: false, target: 'conditions' },
  corrosionallowance: { field: 'corrosionAllowance', numeric: true, target: 'conditions' },
  milltolerance: { field: 'millTolerance', numeric: true, target: 'conditions' },
  stiffenedlength: { field: 'stiffenedLength', numeric: true, target: 'conditions' },
};
const REQUIRED = ['name', 'pressure', 'temperature'];
const FIELD_TO_COLUMN = new Map(Object.entries(COLUMNS).map(([col, c]) => [c.field, col]));

const issue = (line: number, column: string | null, message: string): CsvIssue => ({
  line,
  column,
  path: column ? `line ${line}: ${column}` : `line ${line}`,
  message,
});

/**
 * Turn line-list rows into spool documents holding design conditions (no elements yet).
 * Every problem is reported with its line; callers write nothing unless `issues` is empty.
 */
export async function readLineList(
  headers: readonly string[],
  rows: readonly CsvRow[],
): Promise<{ docs: SpoolDocument[]; lines: number[]; issues: CsvIssue[] }> {
  const issues: CsvIssue[] = [];
  const known = new Map<string, string>();
  for (const h of headers) {
    const k = key(h);
    if (COLUMNS[k]) known.set(h, k);
    else issues.push(issue(1, h, `unknown column (use ${Object.keys(COLUMNS).join(', ')})`));
  }
  for (const r of REQUIRED)
    if (![...known.values()].includes(r)) issues.push(issue(1, r, 'required column is missing'));
  if (rows.length === 0) issues.push(issue(2, null, 'the file has no data rows'));
  if (issues.length > 0) return { docs: [], lines: [], issues };

  const docs: SpoolDocument[] = [];
  /** File line of each document in `docs`. */
  const lines: number[] = [];
  const slice = createSlicer();
  for (const row of rows) {
    await slice();
    const doc: Record<string, unknown> = { units: 'imperial', elements: [] };
    const conditions: Record<string, unknown> = {};
    for (const [header, raw] of Object.entries(row.values)) {
      const col = known.get(header);
      if (!col || raw === '' || raw === undefined) continue;
      const spec = COLUMNS[col]!;
      const value =
        spec.numeric && /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(raw) ? Number(raw) : raw;
      if (spec.target === 'doc')
        doc[spec.field] = spec.field === 'units' ? raw.toLowerCase() : value;
      else conditions[spec.field] = value;
    }
    doc.conditions = conditions;
    if (doc.name === undefined) issues.push(issue(row.line, 'name', 'is required'));
    const parsed = spoolDocumentSchema.safeParse(doc);
    if (!parsed.success) {
      for (const iss of parsed.error.issues) {
        const field = iss.path[iss.path.length - 1];
        const column =
          typeof field === 'string'
            ? (FIELD_TO_COLUMN.get(field) ?? formatPath(iss.path))
            : formatPath(iss.path);
        issues.push(issue(row.line, column, iss.message));
      }
    } else if (doc.name !== undefined) {
      docs.push(parsed.data as SpoolDocument);
      lines.push(row.line);
    }
  }
  return { docs, lines, issues };
}
