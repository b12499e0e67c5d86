import type { CalcSheet, SheetElement, SheetRow } from '@shared/report/calc-sheet';
import { CheckBadge } from '@/components/ui/status-badge';
import { cn } from '@/lib/cn';

function FromMemory() {
  return (
    <span
      className="ml-1 rounded bg-amber-100 px-1 text-[10px] font-semibold text-amber-900"
      title="recalled from memory: verify against the licensed edition"
    >
      FROM MEMORY: verify
    </span>
  );
}

function RowsTable({
  rows,
  withSource,
  testId,
}: {
  rows: readonly SheetRow[];
  withSource?: boolean;
  testId?: string;
}) {
  return (
    <table className="cs-table w-full text-xs" data-testid={testId}>
      {withSource ? (
        <thead>
          <tr>
            <th className="w-[36%]" />
            <th className="w-[20%]">value</th>
            <th>source</th>
          </tr>
        </thead>
      ) : null}
      <tbody>
        {rows.map((r) => (
          <tr
            key={r.label}
            className={cn(
              r.strong && 'font-semibold',
              r.value.startsWith('ORDER HEAVIER') && 'text-red-700',
            )}
          >
            <td>{r.label}</td>
            <td className="tabular-nums">{r.value}</td>
            {withSource ? (
              <td className="text-steel-500">
                {r.source}
                {r.fromMemory ? <FromMemory /> : null}
              </td>
            ) : r.source !== undefined ? (
              <td className="text-steel-500">{r.source}</td>
            ) : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ElementSection({ e }: { e: SheetElement }) {
  return (
    <section
      className="cs-element flex flex-col gap-3"
      data-testid="calc-sheet-element"
      data-element-id={e.id}
      aria-label={e.title}
    >
      <header>
        <h2 className="flex items-center gap-2 text-lg font-semibold text-steel-900">
          {e.title} <CheckBadge status={e.status} />
        </h2>
        <p className="text-sm text-steel-600">
          {e.statusLabel} · governed by {e.governing}
        </p>
        <p className="text-xs text-steel-500">{e.description}</p>
      </header>
      {e.issues.length > 0 ? (
        <ul
          role="alert"
          className="rounded border border-red-200 bg-red-50 p-2 text-xs text-red-800"
        >
          {e.issues.map((i) => (
            <li key={i}>{i}</li>
          ))}
        </ul>
      ) : null}
      <div>
        <h3 className="cs-h3">Check</h3>
        <RowsTable rows={e.figures} />
      </div>
      {e.cases.length > 1 ? (
        <div>
          <h3 className="cs-h3">Cases</h3>
          <table className="cs-table w-full text-xs">
            <thead>
              <tr>
                <th>location</th>
                <th>equation</th>
                <th>I</th>
                <th>t</th>
                <th>tm</th>
                <th>ordered wall</th>
                {e.cases.some((c) => c.allowablePressure !== '—') ? <th>allowable ext.</th> : null}
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {e.cases.map((c) => (
                <tr key={c.location} className={cn(c.governing && 'font-semibold text-copper-600')}>
                  <td>
                    {c.location}
                    {c.governing ? ' (governs)' : ''}
                  </td>
                  <td>{c.equation}</td>
                  <td>{c.I}</td>
                  <td>{c.t}</td>
                  <td>{c.tm}</td>
                  <td>{c.orderedWall}</td>
                  {e.cases.some((x) => x.allowablePressure !== '—') ? (
                    <td>{c.allowablePressure}</td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {e.preBend ? (
        <div>
          <h3 className="cs-h3">Wall before bending</h3>
          <RowsTable rows={e.preBend} />
        </div>
      ) : null}
      {e.messages.length > 0 ? (
        <div>
          <h3 className="cs-h3">Notes</h3>
          <ul className="flex flex-col gap-1 text-xs">
            {e.messages.map((m, i) => (
              <li
                key={i}
                className={cn(
                  m.level === 'error'
                    ? 'text-red-800'
                    : m.level === 'warning'
                      ? 'text-amber-900'
                      : 'text-steel-700',
                )}
              >
                {m.level === 'info' ? 'note' : m.level}: {m.text}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <div>
        <h3 className="cs-h3">Equation trail</h3>
        <p className="mb-1 text-[11px] text-steel-500">
          Substituted values are in the document's units.
        </p>
        {e.trail.map((g) => (
          <div key={g.title} className="mb-2">
            <h4
              className={cn(
                'text-xs font-semibold',
                g.governing ? 'text-copper-600' : 'text-steel-800',
              )}
            >
              {g.title}
            </h4>
            <ol className="flex flex-col gap-1">
              {g.steps.map((s, i) => (
                <li
                  key={i}
                  className="cs-step rounded border border-steel-200 p-1.5 text-xs"
                  data-testid="calc-sheet-trail-step"
                >
                  <div className="flex justify-between gap-2">
                    <span className="font-medium text-steel-700">{s.label}</span>
                    <span className="shrink-0 text-steel-500">{s.equation}</span>
                  </div>
                  <div className="font-mono text-steel-600">{s.formula}</div>
                  <div className="font-mono text-steel-800">{s.substituted}</div>
                  <div className="text-right font-mono font-semibold text-steel-900">
                    {s.result}
                  </div>
                </li>
              ))}
            </ol>
          </div>
        ))}
      </div>
      <div>
        <h3 className="cs-h3">Inputs and their sources</h3>
        <table className="cs-table w-full text-xs">
          <thead>
            <tr>
              <th>symbol</th>
              <th>input</th>
              <th>value</th>
              <th>source</th>
            </tr>
          </thead>
          <tbody>
            {e.inputs.map((i, n) => (
              <tr key={n} className="align-top">
                <td className="font-mono font-semibold">{i.symbol}</td>
                <td>{i.label}</td>
                <td className="tabular-nums">{i.value}</td>
                <td className="text-steel-500">
                  {i.source}
                  {i.fromMemory ? <FromMemory /> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/** The calc sheet on screen and on paper: the same model the PDF is drawn from. */
export function CalcSheetView({ sheet }: { sheet: CalcSheet }) {
  return (
    <article className="calc-sheet flex flex-col gap-6 text-steel-800" data-testid="calc-sheet">
      <section className="cs-cover flex flex-col gap-3">
        <header>
          <h1 className="text-xl font-semibold text-steel-900">{sheet.title}</h1>
          <p className="text-base font-semibold text-copper-600">
            {sheet.spoolName} · {sheet.revisionLabel}
          </p>
        </header>
        <RowsTable rows={sheet.identity} testId="calc-sheet-identity" />
        <div>
          <h2 className="cs-h2">Design conditions</h2>
          <RowsTable rows={sheet.conditions} withSource />
          {sheet.derived.length > 0 ? (
            <>
              <p className="my-1 text-xs text-steel-500">
                Values the check took for elements that keep the spool conditions (elements with
                their own conditions list theirs under their inputs):
              </p>
              <RowsTable rows={sheet.derived} withSource />
            </>
          ) : null}
        </div>
        <div>
          <h2 className="cs-h2">Result summary</h2>
          <p className="text-sm">{sheet.summary}</p>
          {sheet.fromMemoryCount > 0 ? (
            <p className="text-sm font-semibold text-amber-900">
              {sheet.fromMemoryCount} input value(s) are recalled from memory and flagged FROM
              MEMORY: verify them against the licensed edition.
            </p>
          ) : null}
          <table className="cs-table mt-2 w-full text-xs" data-testid="calc-sheet-overview">
            <thead>
              <tr>
                <th>element</th>
                <th>kind</th>
                <th>size</th>
                <th>governing case</th>
                <th>ordered wall needed</th>
                <th>chosen wall</th>
                <th>margin</th>
                <th>status</th>
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {sheet.overview.map((r) => (
                <tr key={r.id}>
                  <td>
                    <a
                      href={`#element-${r.id}`}
                      className="text-copper-600 underline-offset-2 hover:underline"
                    >
                      {r.id}
                    </a>
                  </td>
                  <td>{r.kind}</td>
                  <td>{r.size}</td>
                  <td>{r.governing}</td>
                  <td>{r.orderedWall}</td>
                  <td>{r.chosenWall}</td>
                  <td>{r.margin}</td>
                  <td>
                    <CheckBadge status={r.status.toLowerCase()} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div>
          <h2 className="cs-h2">History of this revision</h2>
          {sheet.history.length > 0 ? (
            <table className="cs-table w-full text-xs" data-testid="calc-sheet-history">
              <thead>
                <tr>
                  <th>when</th>
                  <th>step</th>
                  <th>by</th>
                  <th>note</th>
                </tr>
              </thead>
              <tbody>
                {sheet.history.map((h, i) => (
                  <tr key={i}>
                    <td className="tabular-nums">{h.when}</td>
                    <td>{h.move}</td>
                    <td>{h.who}</td>
                    <td>{h.note}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            <p className="text-sm text-steel-500">{sheet.historyNote}</p>
          )}
        </div>
      </section>
      {sheet.elements.map((e) => (
        <div key={e.id} id={`element-${e.id}`}>
          <ElementSection e={e} />
        </div>
      ))}
    </article>
  );
}
