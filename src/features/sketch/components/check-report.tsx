import type { CaseResult, ElementCheck, TrailStep } from '@shared/engine/types';
import { EXTERNAL_BASIS_LABEL } from '@shared/engine';
import { Button } from '@/components/ui/button';
import { CheckBadge } from '@/components/ui/status-badge';
import { formatNumber, formatPercent } from '@/lib/format';
import { cn } from '@/lib/cn';
import { UNIT_LABELS } from '@shared/units/units';
import { useDisplayUnits } from './display-units';

const CASE_LABELS: Record<string, string> = {
  straight: 'straight pipe',
  intrados: 'bend intrados',
  extrados: 'bend extrados',
  sidewall: 'bend sidewall',
  external: 'external pressure',
};

export const caseLabel = (c: string | null | undefined) => (c ? (CASE_LABELS[c] ?? c) : '—');

function Row({
  label,
  children,
  testId,
  strong,
}: {
  label: string;
  children: React.ReactNode;
  testId?: string;
  strong?: boolean;
}) {
  return (
    <div className="flex items-baseline justify-between gap-2 border-b border-steel-100 py-0.5">
      <dt className="text-xs text-steel-500">{label}</dt>
      <dd
        data-testid={testId}
        className={cn('text-right text-sm tabular-nums text-steel-900', strong && 'font-semibold')}
      >
        {children}
      </dd>
    </div>
  );
}

function useLen() {
  const units = useDisplayUnits();
  return (v: number | null | undefined) =>
    v === null || v === undefined
      ? '—'
      : `${formatNumber(units.toDisplay(v, 'length'))} ${units.label('length')}`;
}

/** Trail steps; `restated`: the steps already come in display units (no further conversion). */
function TrailList({ steps, restated }: { steps: readonly TrailStep[]; restated?: boolean }) {
  const units = useDisplayUnits();
  return (
    <ol className="flex flex-col gap-1.5">
      {steps.map((s, i) => {
        const shown = restated ? { value: s.value, unit: s.unit } : units.showUnit(s.value, s.unit);
        return (
          <li
            key={i}
            className="rounded border border-steel-200 bg-steel-50 p-1.5 text-xs"
            data-testid="trail-step"
          >
            <div className="flex justify-between gap-2">
              <span className="font-medium text-steel-700">{s.label}</span>
              <span className="shrink-0 text-steel-500">{s.equation}</span>
            </div>
            <div className="font-mono text-steel-800">{s.formula}</div>
            <div className="font-mono text-steel-600">{s.substituted}</div>
            <div className="text-right font-mono font-semibold text-steel-900">
              {s.symbol} = {formatNumber(shown.value)} {shown.unit}
            </div>
          </li>
        );
      })}
    </ol>
  );
}

function CasesTable({
  cases,
  governing,
}: {
  cases: readonly CaseResult[];
  governing: string | null;
}) {
  const len = useLen();
  return (
    <table className="w-full text-xs" data-testid="case-table">
      <thead className="text-left text-steel-500">
        <tr>
          <th className="py-0.5 font-medium">location</th>
          <th className="font-medium">I</th>
          <th className="font-medium">t</th>
          <th className="font-medium">tm</th>
          <th className="font-medium">ordered wall</th>
        </tr>
      </thead>
      <tbody className="tabular-nums">
        {cases.map((c) => (
          <tr
            key={c.case}
            className={cn(
              'border-t border-steel-100',
              c.case === governing && 'font-semibold text-copper-600',
            )}
          >
            <td className="py-0.5">{caseLabel(c.case)}</td>
            <td>{c.I === undefined ? '—' : formatNumber(c.I)}</td>
            <td>{len(c.t)}</td>
            <td>{len(c.tm)}</td>
            <td>{len(c.requiredNominalWall)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The governing case's trail first, then the other cases and the wall before bending, from `trail` (which may be restated in display units). */
function EquationTrail({ check, trail }: { check: ElementCheck; trail: ElementCheck }) {
  const units = useDisplayUnits();
  const restated = trail !== check || units.display === units.doc;
  const source = restated ? trail : check;
  const governing = source.cases.find((c) => c.case === check.governing) ?? source.cases[0];
  const labels = UNIT_LABELS[units.display];
  return (
    <>
      <p className="my-1 text-[11px] text-steel-500" data-testid="trail-units">
        {restated
          ? `Values in ${labels.length}, ${labels.pressure}, ${labels.temperature} (the display units).`
          : `Substituted values are in the document's units (${units.doc}).`}
      </p>
      {governing ? <TrailList steps={governing.trail} restated={restated} /> : null}
      {source.cases
        .filter((c) => c !== governing)
        .map((c) => (
          <details key={c.case} className="mt-2">
            <summary className="cursor-pointer text-xs text-steel-600">{caseLabel(c.case)}</summary>
            <TrailList steps={c.trail} restated={restated} />
          </details>
        ))}
      {source.preBend && source.preBend.trail.length > 0 ? (
        <details className="mt-2">
          <summary className="cursor-pointer text-xs text-steel-600">wall before bending</summary>
          <TrailList steps={source.preBend.trail} restated={restated} />
        </details>
      ) : null}
    </>
  );
}

export interface CheckReportProps {
  readonly check: ElementCheck;
  /** Current schedule of the element, to decide whether "use it" applies. */
  readonly schedule?: string;
  readonly onUseSchedule?: (schedule: string) => void;
  readonly readOnly?: boolean;
  /**
   * The same element checked with every input restated in the display units (see
   * `useDisplayUnitCheck`): its trail is shown, so substituted numbers read in the display
   * units. Default: `check` (display = document units).
   */
  readonly trailCheck?: ElementCheck;
}

/** The wall check of one element: the figures, per-location cases, wall before bending, trail and inputs. */
export function CheckReport({
  check,
  schedule,
  onUseSchedule,
  readOnly,
  trailCheck,
}: CheckReportProps) {
  const units = useDisplayUnits();
  const len = useLen();
  const governingCase = check.cases.find((c) => c.case === check.governing);
  const externalCase = check.cases.find((c) => c.case === 'external');
  const pressure = (v: number) =>
    `${formatNumber(units.toDisplay(v, 'pressure'))} ${units.label('pressure')}`;
  const canUse = check.lightestSchedule !== null && check.lightestSchedule !== schedule;
  return (
    <section aria-label="Wall check" className="flex flex-col gap-3" data-testid="check-report">
      <div className="flex items-center gap-2">
        <CheckBadge status={check.status} />
        <span className="text-sm text-steel-700">
          governed by <strong data-testid="governing-case">{caseLabel(check.governing)}</strong>
        </span>
      </div>
      {check.inputIssues.length > 0 ? (
        <ul
          role="alert"
          className="rounded border border-red-200 bg-red-50 p-2 text-xs text-red-800"
        >
          {check.inputIssues.map((iss, i) => (
            <li key={i}>
              <code>{iss.path}</code>: {iss.message}
            </li>
          ))}
        </ul>
      ) : null}
      <dl>
        <Row label="pressure design thickness t">{len(governingCase?.t)}</Row>
        <Row label="minimum required thickness tm = t + c">{len(governingCase?.tm)}</Row>
        <Row label="ordered nominal wall needed" strong>
          {len(check.requiredNominalWall)}
        </Row>
        <Row label="chosen nominal wall">{len(check.nominalWall)}</Row>
        <Row label="chosen minimum wall (after mill tolerance)">{len(check.minimumWall)}</Row>
        <Row label="margin" testId="margin">
          {formatPercent(check.margin)}
        </Row>
        <Row label="MAWP of chosen wall">{pressure(check.mawp)}</Row>
        {externalCase?.allowablePressure !== undefined ? (
          <>
            <Row
              label="allowable external pressure (lower of the two)"
              testId="external-allowable"
              strong
            >
              {pressure(externalCase.allowablePressure)}
            </Row>
            <Row label="UG-28 value (from memory)" testId="external-ug28">
              {pressure(externalCase.allowableUg28 ?? 0)}
            </Row>
            <Row label="VIII-2 4.4.5.1 value (from memory)" testId="external-viii2">
              {pressure(externalCase.allowableVIII2 ?? 0)}
            </Row>
            <Row label="governs" testId="external-basis">
              {EXTERNAL_BASIS_LABEL[externalCase.allowableBasis ?? 'ug28-elastic']}
            </Row>
          </>
        ) : null}
      </dl>
      <div className="flex items-center justify-between gap-2 rounded border border-steel-200 bg-white p-2">
        <div className="text-xs text-steel-600">
          lightest passing schedule:{' '}
          <strong data-testid="lightest-schedule" className="text-sm text-steel-900">
            {check.lightestSchedule ?? 'none listed passes'}
          </strong>
          {check.lightest ? (
            <span data-testid="lightest-standard" className="ml-1">
              {check.lightest.names.length > 1
                ? `(= ${check.lightest.names.slice(1).join(' / ')}) `
                : ''}
              ASME {check.lightest.standard}
            </span>
          ) : null}
        </div>
        {onUseSchedule && !readOnly && check.lightestSchedule !== null ? (
          <Button
            size="sm"
            variant="primary"
            disabled={!canUse}
            onClick={() => onUseSchedule(check.lightestSchedule!)}
          >
            {canUse ? `Use schedule ${check.lightestSchedule}` : 'in use'}
          </Button>
        ) : null}
      </div>
      {check.cases.length > 1 ? (
        <CasesTable cases={check.cases} governing={check.governing} />
      ) : null}
      {check.preBend ? (
        <div className="rounded border border-steel-200 p-2" data-testid="pre-bend">
          <h4 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">
            Wall before bending
          </h4>
          <dl>
            <Row label="R1 / D">{formatNumber(check.preBend.radiusRatio)}</Row>
            <Row label="table factor">
              {check.preBend.tableFactor === null
                ? 'outside table'
                : formatNumber(check.preBend.tableFactor)}
            </Row>
            <Row label="wall by table factor">{len(check.preBend.tableWall)}</Row>
            <Row label="extrados thinning (geometric)">{len(check.preBend.extradosThinning)}</Row>
            <Row label="intrados thickening (geometric)">
              {len(check.preBend.intradosThickening)}
            </Row>
            <Row label="wall by geometric estimate">{len(check.preBend.geometricWall)}</Row>
            <Row label="ordered wall needed before bending" strong>
              {len(check.preBend.requiredOrderedWall)}
            </Row>
            <Row label="order">
              {check.preBend.orderHeavier ? (
                <span className="font-semibold text-red-700">
                  heavier:{' '}
                  {check.preBend.order?.label ??
                    check.preBend.orderSchedule ??
                    'no listed schedule'}
                </span>
              ) : (
                'chosen schedule is enough'
              )}
            </Row>
          </dl>
        </div>
      ) : null}
      {check.messages.length > 0 ? (
        <ul className="flex flex-col gap-1 text-xs">
          {check.messages.map((m, i) => (
            <li
              key={i}
              data-code={m.code}
              className={cn(
                'rounded px-2 py-1',
                m.level === 'error'
                  ? 'bg-red-50 text-red-800'
                  : m.level === 'warning'
                    ? 'bg-amber-50 text-amber-900'
                    : 'bg-steel-100 text-steel-700',
              )}
            >
              {m.text}
            </li>
          ))}
        </ul>
      ) : null}
      <details className="rounded border border-steel-200 p-2" open>
        <summary className="cursor-pointer text-xs font-semibold uppercase tracking-wide text-steel-600">
          Equation trail
        </summary>
        <EquationTrail check={check} trail={trailCheck ?? check} />
      </details>
      <details className="rounded border border-steel-200 p-2">
        <summary className="cursor-pointer text-xs font-semibold uppercase tracking-wide text-steel-600">
          Inputs and their sources
        </summary>
        <table className="mt-1 w-full text-xs" data-testid="inputs-table">
          <tbody>
            {check.inputs.map((inp, i) => {
              const shown = units.showUnit(inp.value, inp.unit);
              return (
                <tr key={i} className="border-t border-steel-100 align-top">
                  <td className="py-0.5 pr-1 font-mono font-semibold">{inp.symbol}</td>
                  <td className="pr-1">{inp.label}</td>
                  <td className="pr-1 text-right tabular-nums">
                    {formatNumber(shown.value)} {shown.unit}
                  </td>
                  <td className="text-steel-500">
                    {inp.source}
                    {inp.fromMemory ? (
                      <span
                        className="ml-1 rounded bg-amber-100 px-1 font-semibold text-amber-900"
                        title="recalled from memory: verify against the licensed edition"
                      >
                        from memory — verify
                      </span>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </details>
    </section>
  );
}
