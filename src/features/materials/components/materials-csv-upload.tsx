import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { CsvIssuesTable, readCsvFile } from '@/components/ui/csv-issues';
import { TextField } from '@/components/ui/field';
import { tableClass, tdClass, thClass } from '@/components/ui/page-frame';
import { useImportMaterialsCsv } from '../api/import-materials-csv';
import { usePreviewMaterialsCsv } from '../api/preview-materials-csv';
import { RecheckNote } from './recheck-note';

/**
 * Materials CSV: pick the file and its source note, check it (dry run: every problem by line and
 * column, nothing written), then import all of it.
 */
export function MaterialsCsvUpload() {
  const preview = usePreviewMaterialsCsv();
  const commit = useImportMaterialsCsv();
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [source, setSource] = useState('');
  const [localError, setLocalError] = useState<{
    field: 'file' | 'source';
    message: string;
  } | null>(null);
  const checked =
    preview.data &&
    preview.variables?.csv === file?.text &&
    preview.variables.source === source.trim()
      ? preview.data
      : undefined;

  const check = () => {
    commit.reset();
    if (!file) return setLocalError({ field: 'file', message: 'CSV file: choose a file first' });
    if (source.trim().length < 3)
      return setLocalError({
        field: 'source',
        message:
          'Source note: give the source of the values (table, edition, document), at least 3 characters',
      });
    setLocalError(null);
    preview.mutate({ csv: file.text, source: source.trim() });
  };

  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-steel-600">
        One row per material and temperature. Columns{' '}
        <code className="font-mono text-xs">
          id, spec, grade, tensile_ksi, yield_ksi, temp_f, stress_ksi
        </code>
        ; optional{' '}
        <code className="font-mono text-xs">
          name, category, y_family, w_family, modulus_group, product_forms, yield_at_ksi,
          from_memory
        </code>
        . A team row with a built-in id replaces it for the team.
      </p>
      <div className="grid grid-cols-[1fr_1fr_auto] items-start gap-3">
        <TextField
          label="CSV file"
          type="file"
          accept=".csv,text/csv"
          error={localError?.field === 'file' ? localError.message : undefined}
          onChange={(e) => {
            const f = e.target.files?.[0];
            preview.reset();
            commit.reset();
            if (!f) return setFile(null);
            readCsvFile(f).then(
              (text) => {
                setLocalError(null);
                setFile({ name: f.name, text });
              },
              (err: unknown) =>
                setLocalError({
                  field: 'file',
                  message: `CSV file: ${err instanceof Error ? err.message : String(err)}`,
                }),
            );
          }}
        />
        <TextField
          label="Source note for the file"
          hint="Required: where the values come from"
          value={source}
          onChange={(e) => setSource(e.target.value)}
          error={localError?.field === 'source' ? localError.message : undefined}
        />
        <Button className="mt-4" onClick={check} disabled={preview.isPending}>
          {preview.isPending ? 'Checking…' : 'Check the file'}
        </Button>
      </div>
      {preview.isError ? (
        <p role="alert" className="text-sm text-red-700">
          {preview.error.message}
        </p>
      ) : null}
      {checked && !checked.ok ? <CsvIssuesTable issues={checked.issues} /> : null}
      {checked && checked.ok && !commit.isSuccess ? (
        <div className="flex flex-col gap-2" aria-label="Materials in the file">
          <p className="text-sm text-steel-700">
            {file?.name}: {checked.items.length} material{checked.items.length === 1 ? '' : 's'}, no
            problems. Nothing is written until you import.
          </p>
          <table className={tableClass} data-testid="materials-preview">
            <thead>
              <tr>
                <th className={thClass}>Id</th>
                <th className={thClass}>Name</th>
                <th className={thClass}>Temperatures</th>
                <th className={thClass}>From memory</th>
                <th className={thClass}>Effect</th>
              </tr>
            </thead>
            <tbody>
              {checked.items.map((m) => (
                <tr key={m.id}>
                  <td className={`${tdClass} font-mono text-xs`}>{m.id}</td>
                  <td className={tdClass}>{m.name}</td>
                  <td className={`${tdClass} tabular-nums`}>
                    {m.rows} row{m.rows === 1 ? '' : 's'}, {m.minTempF}–{m.maxTempF} °F
                  </td>
                  <td className={tdClass}>{m.fromMemory ? 'yes' : 'no'}</td>
                  <td className={tdClass}>
                    {m.replaces === 'team'
                      ? 'replaces the team row'
                      : m.replaces === 'library'
                        ? 'replaces the built-in row for the team'
                        : 'new'}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <div>
            <Button
              variant="primary"
              disabled={commit.isPending || !file}
              onClick={() => file && commit.mutate({ csv: file.text, source: source.trim() })}
            >
              {commit.isPending
                ? 'Importing…'
                : `Import ${checked.items.length} material${checked.items.length === 1 ? '' : 's'}`}
            </Button>
          </div>
        </div>
      ) : null}
      {commit.isError ? (
        <p role="alert" className="text-sm text-red-700">
          {commit.error.message}
        </p>
      ) : null}
      {commit.isSuccess ? (
        <p role="status" className="text-sm text-emerald-800">
          Imported {commit.data.imported} material{commit.data.imported === 1 ? '' : 's'}.{' '}
          <RecheckNote result={commit.data} />
        </p>
      ) : null}
    </div>
  );
}
