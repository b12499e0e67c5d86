import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { CsvIssuesTable, readCsvFile } from '@/components/ui/csv-issues';
import { TextField } from '@/components/ui/field';
import { PageFrame, Panel, tableClass, tdClass, thClass } from '@/components/ui/page-frame';
import { useCan } from '@/features/auth/use-can';
import { formatNumber } from '@/lib/format';
import { useImportLineList } from '../api/import-line-list';
import { usePreviewLineList, type LineListPreview } from '../api/preview-line-list';

const UNITS = {
  imperial: { pressure: 'psi', temperature: '°F', length: 'in' },
  metric: { pressure: 'MPa', temperature: '°C', length: 'mm' },
} as const;

const cell = (v: unknown, unit?: string) =>
  typeof v === 'number'
    ? `${formatNumber(v)}${unit ? ` ${unit}` : ''}`
    : typeof v === 'string' && v !== ''
      ? v
      : '—';

/**
 * Line-list import: one spool per CSV row with its design conditions. Check the file first
 * (every bad cell by line and column, nothing written), then create all the spools or none.
 */
export function LineListPage() {
  const canEdit = useCan('spool:edit');
  const preview = usePreviewLineList();
  const create = useImportLineList();
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const checked = preview.data && preview.variables === file?.text ? preview.data : undefined;

  return (
    <PageFrame
      title="Line-list import"
      intro="Create spools from a line list: one row per spool with its design conditions; the elements are drawn afterwards in the sketcher."
    >
      <Panel title="Upload">
        <p className="mb-3 text-sm text-steel-600">
          Columns <code className="font-mono text-xs">name, pressure, temperature</code> (required)
          and{' '}
          <code className="font-mono text-xs">
            line, units, external pressure, material, allowable stress, quality factor, product
            form, corrosion allowance, mill tolerance, stiffened length
          </code>
          . Values are in the row's units (imperial: psi, °F, in; metric: MPa, °C, mm).
        </p>
        {!canEdit ? (
          <p role="alert" className="mb-3 text-sm text-red-700">
            Your role cannot create spools.
          </p>
        ) : null}
        <div className="grid grid-cols-[1fr_auto] items-start gap-3">
          <TextField
            label="Line-list CSV"
            type="file"
            accept=".csv,text/csv"
            error={fileError ?? undefined}
            onChange={(e) => {
              const f = e.target.files?.[0];
              preview.reset();
              create.reset();
              if (!f) return setFile(null);
              readCsvFile(f).then(
                (text) => {
                  setFileError(null);
                  setFile({ name: f.name, text });
                },
                (err: unknown) =>
                  setFileError(
                    `Line-list CSV: ${err instanceof Error ? err.message : String(err)}`,
                  ),
              );
            }}
          />
          <Button
            className="mt-4"
            disabled={preview.isPending || !canEdit}
            onClick={() => {
              create.reset();
              if (!file) return setFileError('Line-list CSV: choose a file first');
              preview.mutate(file.text);
            }}
          >
            {preview.isPending ? 'Checking…' : 'Check the file'}
          </Button>
        </div>
        {preview.isError ? (
          <p role="alert" className="mt-2 text-sm text-red-700">
            {preview.error.message}
          </p>
        ) : null}
      </Panel>
      {checked ? (
        <Panel title="Preview" label="Line-list preview">
          <div className="flex flex-col gap-3">
            {!checked.ok ? <CsvIssuesTable issues={checked.issues} /> : null}
            <p className="text-sm text-steel-700">
              {file?.name}: {checked.items.length} spool{checked.items.length === 1 ? '' : 's'} read
              without problems
              {checked.ok
                ? '. Nothing is written until you create them.'
                : `; the file has ${checked.issues.length} problem${checked.issues.length === 1 ? '' : 's'}, so none will be created.`}
            </p>
            {checked.items.length > 0 ? <PreviewTable items={checked.items} /> : null}
            {checked.ok && !create.isSuccess ? (
              <div>
                <Button
                  variant="primary"
                  disabled={create.isPending}
                  onClick={() => file && create.mutate(file.text)}
                >
                  {create.isPending
                    ? 'Creating…'
                    : `Create ${checked.items.length} spool${checked.items.length === 1 ? '' : 's'}`}
                </Button>
              </div>
            ) : null}
            {create.isError ? (
              <p role="alert" className="text-sm text-red-700">
                {create.error.message}
              </p>
            ) : null}
            {create.isSuccess ? (
              <div role="status" className="text-sm text-emerald-800">
                Created {create.data.created} spool{create.data.created === 1 ? '' : 's'}:{' '}
                {create.data.items.map((s, i) => (
                  <span key={s.id}>
                    {i > 0 ? ', ' : ''}
                    <Link
                      to={`/spools/${s.id}`}
                      className="font-medium text-copper-600 hover:underline"
                    >
                      {s.name}
                    </Link>
                  </span>
                ))}
                .
              </div>
            ) : null}
          </div>
        </Panel>
      ) : null}
    </PageFrame>
  );
}

function PreviewTable({ items }: { readonly items: LineListPreview['items'] }) {
  return (
    <table className={tableClass} data-testid="line-list-preview">
      <thead>
        <tr>
          <th className={thClass}>CSV line</th>
          <th className={thClass}>Spool</th>
          <th className={thClass}>Line</th>
          <th className={thClass}>Units</th>
          <th className={thClass}>Pressure</th>
          <th className={thClass}>Temperature</th>
          <th className={thClass}>Material</th>
          <th className={thClass}>Corrosion allowance</th>
        </tr>
      </thead>
      <tbody>
        {items.map((s) => {
          const u = UNITS[s.units];
          const c = s.conditions;
          return (
            <tr key={`${s.line}-${s.name}`} data-line={s.line ?? ''}>
              <td className={`${tdClass} tabular-nums`}>{s.line ?? '—'}</td>
              <td className={`${tdClass} font-medium`}>{s.name}</td>
              <td className={tdClass}>{s.pipeLine || '—'}</td>
              <td className={tdClass}>{s.units}</td>
              <td className={`${tdClass} tabular-nums`}>{cell(c.pressure, u.pressure)}</td>
              <td className={`${tdClass} tabular-nums`}>{cell(c.temperature, u.temperature)}</td>
              <td className={tdClass}>
                {cell(
                  c.material ??
                    (c.allowableStress !== undefined
                      ? `S = ${String(c.allowableStress)} ${u.pressure}`
                      : undefined),
                )}
              </td>
              <td className={`${tdClass} tabular-nums`}>{cell(c.corrosionAllowance, u.length)}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
