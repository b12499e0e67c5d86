import { tableClass, tdClass, thClass } from './page-frame';

/** A problem in an uploaded CSV as the server reports it (header = line 1). */
export interface CsvIssue {
  readonly line: number | null;
  readonly column: string | null;
  readonly path: string;
  readonly message: string;
}

/** Every problem of a CSV dry run by line and column; nothing has been written when this shows. */
export function CsvIssuesTable({
  issues,
  label = 'Problems in the file',
}: {
  readonly issues: readonly CsvIssue[];
  readonly label?: string;
}) {
  return (
    <div role="alert" aria-label={label} className="rounded border border-red-300 bg-red-50 p-3">
      <p className="mb-2 text-sm font-medium text-red-800">
        {issues.length} problem{issues.length === 1 ? '' : 's'} found; nothing was written. Fix the
        file and check it again.
      </p>
      <table className={tableClass} data-testid="csv-issues">
        <thead>
          <tr>
            <th className={thClass}>Line</th>
            <th className={thClass}>Column</th>
            <th className={thClass}>Problem</th>
          </tr>
        </thead>
        <tbody>
          {issues.map((i, n) => (
            <tr key={n} data-line={i.line ?? ''} data-column={i.column ?? ''}>
              <td className={`${tdClass} tabular-nums`}>{i.line ?? '—'}</td>
              <td className={`${tdClass} font-mono text-xs`}>{i.column ?? '—'}</td>
              <td className={tdClass}>{i.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Largest CSV the server accepts (server/csv.ts). */
export const CSV_MAX_BYTES = 1024 * 1024;

/** Read a picked CSV file, refusing files the server would refuse for size. */
export async function readCsvFile(file: File): Promise<string> {
  if (file.size > CSV_MAX_BYTES) throw new Error(`${file.name} is larger than 1 MB`);
  return file.text();
}
