import { useMemo, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { createMaterialLookup } from '@shared/data/materials';
import { checkSpool, type SpoolCheck } from '@shared/engine/index';
import { parseSpoolDocument, type SpoolDocument } from '@shared/model/spool';
import {
  bomTable,
  buildFabricationSheet,
  csvFileName,
  cutListTable,
  elementTable,
  tableToCsv,
  type FabricationSheet,
  type Table,
  type TableName,
} from '@shared/shop/index';
import { MASS_LABELS, UNIT_LABELS } from '@shared/units/units';
import { Button } from '@/components/ui/button';
import { CautionNote } from '@/components/ui/caution-note';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useMaterials } from '@/features/sketch/api/get-materials';
import { useDocumentTitle } from '@/features/sketch/components/leave-guard';
import { buildSpoolPath, legLengths } from '@/features/sketch/geometry/spool-path';
import { useSpool } from '@/features/spools/api/get-spool';
import type { Spool } from '@/features/spools/api/spool-schemas';
import { API_BASE } from '@/lib/api';
import { formatNumber } from '@/lib/format';
import { cn } from '@/lib/cn';
import { downloadText } from '../download-text';

const n = (v: number | null | undefined, digits = 4) => formatNumber(v, digits);

function Section({ title, children, id }: { title: string; children: ReactNode; id: string }) {
  return (
    <section aria-labelledby={id} className="break-inside-avoid-page">
      <h2 id={id} className="mb-1 text-sm font-semibold uppercase tracking-wide text-steel-700">
        {title}
      </h2>
      {children}
    </section>
  );
}

const th =
  'border-b border-steel-300 px-2 py-1 text-left font-semibold text-steel-600 whitespace-nowrap';
const td = 'border-b border-steel-100 px-2 py-1 align-top tabular-nums';

function SheetTable({
  head,
  rows,
  label,
}: {
  head: readonly ReactNode[];
  rows: readonly (readonly ReactNode[])[];
  label: string;
}) {
  return (
    <div className="overflow-x-auto">
      <table aria-label={label} className="w-full border-collapse text-xs">
        <thead>
          <tr>
            {head.map((h, i) => (
              <th key={i} scope="col" className={th}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i}>
              {r.map((c, j) => (
                <td key={j} className={td}>
                  {c}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Figure({ label, value, testId }: { label: string; value: ReactNode; testId?: string }) {
  return (
    <div className="rounded border border-steel-200 bg-white px-3 py-2">
      <div className="text-xs text-steel-500">{label}</div>
      <div className="text-base font-semibold tabular-nums text-steel-900" data-testid={testId}>
        {value}
      </div>
    </div>
  );
}

function BendList({ sheet }: { sheet: FabricationSheet }) {
  const u = UNIT_LABELS[sheet.units];
  const bends = sheet.elements.filter((e) => e.bend);
  if (bends.length === 0) return <p className="text-xs text-steel-500">No bends.</p>;
  return (
    <>
      <SheetTable
        label="Bend list"
        head={[
          'Bend',
          'NPS',
          'Angle',
          `R (${u.length})`,
          'R/D',
          'R/NPS',
          'Table factor',
          `Table wall (${u.length})`,
          `Geometric wall (${u.length})`,
          `Before bending (${u.length})`,
          'Order',
          `Extrados after / needed (${u.length})`,
          `Intrados after / needed (${u.length})`,
          '',
        ]}
        rows={bends.map((e) => {
          const b = e.bend!;
          return [
            <code key="id">{e.id}</code>,
            e.nps ?? '—',
            `${n(b.angle)}°`,
            n(b.radius),
            n(b.radiusOverD),
            n(b.radiusOverNps),
            b.tableFactor === null ? '—' : n(b.tableFactor),
            n(b.tableWall),
            n(b.geometricWall),
            <span key="before">
              {n(b.wallBeforeBending)}{' '}
              <span className="text-steel-500">({b.governingEstimate} governs)</span>
            </span>,
            <span key="order" className={cn(b.orderHeavier && 'font-semibold text-copper-600')}>
              {e.orderSchedule ? `Sch ${e.orderSchedule}` : 'by wall'} · {n(e.orderWall)}
            </span>,
            `${n(b.extradosWallAfter)} / ${n(b.extradosWallRequired)}`,
            `${n(b.intradosWallAfter)} / ${n(b.intradosWallRequired)}`,
            b.orderHeavier ? (
              <strong
                key="flag"
                className="rounded bg-copper-500 px-1.5 py-px text-white"
                data-testid={`order-heavier-${e.id}`}
              >
                order heavier
              </strong>
            ) : (
              ''
            ),
          ];
        })}
      />
      <p className="mt-1 text-xs text-steel-600">
        Wall before bending: the larger of the B31.1 Table 102.4.5 factor × tm and the geometric
        estimate (neutral axis at the centreline); walls after bending are those of the pipe as
        ordered, less mill under-tolerance. {bends[0]!.bend!.flattening}
      </p>
    </>
  );
}

function CutList({ sheet, legs }: { sheet: FabricationSheet; legs: ReadonlyMap<string, number> }) {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  return (
    <>
      <SheetTable
        label="Cut list"
        head={[
          'Piece',
          'Kind',
          'NPS',
          'Order',
          `Leg (${u.length})`,
          `Tangents taken (${u.length})`,
          `Arc R·θ (${u.length})`,
          `Bending tangents (${u.length})`,
          `Cut length (${u.length})`,
          'End 1',
          'End 2',
          `Mass (${m.mass})`,
        ]}
        rows={sheet.elements.map((e) => [
          <code key="id">{e.id}</code>,
          e.kind,
          e.nps ?? `D ${n(e.outsideDiameter)}`,
          `${e.orderSchedule ? `Sch ${e.orderSchedule}` : 'by wall'} · ${n(e.orderWall)}`,
          e.kind === 'straight' ? n(legs.get(e.id)) : '—',
          e.kind === 'straight'
            ? `${n(e.tangentBefore)} + ${n(e.tangentAfter)}`
            : `${n(e.bend?.tangent)} each leg`,
          e.bend ? n(e.bend.arcLength) : '—',
          e.bend ? `2 × ${n(e.bend.bendingTangent)}` : '—',
          <strong key="cut" data-testid={`cut-${e.id}`}>
            {n(e.cutLength)}
          </strong>,
          e.ends[0].text,
          e.ends[1].text,
          n(e.mass),
        ])}
      />
      <p className="mt-1 text-xs text-steel-600">
        <span data-testid="weld-count">{sheet.welds}</span> butt welds
        {sheet.otherJoints > 0 ? `, ${sheet.otherJoints} other joints` : ''}. A leg is measured
        between the intersections of the centrelines (as the sketch labels it); a straight is cut to
        its leg less the tangent R·tan(θ/2) of each bend beside it.
      </p>
    </>
  );
}

function BillOfMaterials({ sheet }: { sheet: FabricationSheet }) {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  return (
    <SheetTable
      label="Bill of materials"
      head={[
        'NPS',
        `OD (${u.length})`,
        'Schedule (as ordered)',
        `Wall (${u.length})`,
        'Material',
        'Pieces',
        `Length to order (${u.length})`,
        `Length (${m.run})`,
        `Mass per length (${m.massPerRun})`,
        `Mass (${m.mass})`,
      ]}
      rows={sheet.bom.map((b) => [
        b.nps ?? '—',
        n(b.outsideDiameter),
        b.schedule ?? 'by wall',
        n(b.wall),
        b.material ?? '—',
        b.pieces,
        n(b.length),
        n(b.length / (sheet.units === 'imperial' ? 12 : 1000)),
        n(b.massPerRun),
        n(b.mass),
      ])}
    />
  );
}

function HydrotestPanel({ sheet }: { sheet: FabricationSheet }) {
  const h = sheet.hydrotest;
  const u = UNIT_LABELS[sheet.units];
  if (!h)
    return (
      <p className="text-xs text-steel-500">
        No element with an allowable stress: no test pressure.
      </p>
    );
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm">
        Test pressure{' '}
        <strong data-testid="test-pressure">
          {n(h.pressure)} {u.pressure}
        </strong>{' '}
        at {n(h.testTemperature)} {u.temperature} · ST/S = {n(h.ratio)} ({h.governing} governs)
        {h.limitedBy ? (
          <>
            {' '}
            ·{' '}
            <strong className="text-copper-600">
              reduced from {n(h.unreducedPressure)} {u.pressure}: yield at test temperature in{' '}
              {h.limitedBy}
            </strong>{' '}
            (para. 345.4.2(c))
          </>
        ) : null}
      </p>
      <p className="font-mono text-xs text-steel-700">{h.equation}</p>
      <SheetTable
        label="Hydrotest by element"
        head={[
          'Element',
          `ST (${u.pressure})`,
          `S (${u.pressure})`,
          'ST/S',
          `Sy at test (${u.pressure})`,
          `Pressure at yield (${u.pressure})`,
          'Source of ST',
        ]}
        rows={h.elements.map((e) => [
          <code key="id">{e.id}</code>,
          n(e.ST),
          n(e.S),
          `${n(e.ratio)}${e.ratioCapped ? ' (capped)' : ''}`,
          <span key="sy" title={e.sySource ?? 'no yield strength known'}>
            {n(e.Sy)}
            {e.syFromMemory ? <span className="text-copper-600"> (from memory)</span> : null}
          </span>,
          n(e.yieldPressure),
          <span
            key="src"
            className="line-clamp-1 max-w-md text-steel-500 print:line-clamp-none"
            title={`ST: ${e.stSource}${e.sySource ? ` · Sy: ${e.sySource}` : ''}`}
          >
            {e.stFromMemory ? <strong className="text-copper-600">from memory · </strong> : null}
            {e.stSource}
          </span>,
        ])}
      />
      {h.notes.length > 0 ? (
        <ul className="list-disc pl-5 text-xs text-steel-700">
          {h.notes.map((t) => (
            <li key={t}>{t}</li>
          ))}
        </ul>
      ) : null}
      <p
        role="note"
        className="rounded border-l-4 border-copper-500 bg-copper-400/10 px-2 py-1 text-xs text-steel-700"
        data-testid="hydrotest-caution"
      >
        {h.caution}
      </p>
    </div>
  );
}

/** The fabrication sheet of one spool (saved revision): what the shop orders, cuts, welds, weighs and tests. */
export function FabricationSheetView({
  spool,
  doc,
  check,
  sheet,
}: {
  spool: Spool;
  doc: SpoolDocument;
  check: SpoolCheck;
  sheet: FabricationSheet;
}) {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  const legs = useMemo(() => legLengths(buildSpoolPath(doc)), [doc]);
  const download = (name: TableName, table: Table) =>
    downloadText(csvFileName(doc.name, spool.revision, name), tableToCsv(table));
  const elementNotes = sheet.elements.flatMap((e) => e.notes.map((t) => `${e.id}: ${t}`));
  return (
    <div className="flex flex-col gap-4 p-4 print:p-0" data-testid="fabrication-sheet">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-lg font-semibold text-steel-900">
          Fabrication sheet · {doc.name || 'unnamed spool'}
        </h1>
        {doc.line ? <span className="text-sm text-steel-600">line {doc.line}</span> : null}
        <LifecycleBadge status={spool.status} />
        <span className="text-xs text-steel-500" data-testid="sheet-revision">
          rev. {spool.revision}
        </span>
        <CheckBadge status={check.worst} />
        <div className="ml-auto flex flex-wrap gap-2 print:hidden">
          <Link
            to={`/spools/${spool.id}`}
            className="inline-flex h-7 items-center rounded border border-steel-300 bg-white px-2 text-xs font-medium text-steel-800 hover:bg-steel-100"
          >
            Open sketch
          </Link>
          <Link
            to={`/spools/${encodeURIComponent(spool.id)}/calc-sheet?revision=${spool.revision}`}
            className="inline-flex h-7 items-center rounded border border-steel-300 bg-white px-2 text-xs font-medium text-steel-800 hover:bg-steel-100"
          >
            Calc sheet
          </Link>
          <a
            href={`${API_BASE}/spools/${encodeURIComponent(spool.id)}/calc-sheet.pdf?revision=${spool.revision}`}
            download
            data-testid="calc-sheet-pdf"
            className="inline-flex h-7 items-center rounded border border-steel-300 bg-white px-2 text-xs font-medium text-steel-800 hover:bg-steel-100"
          >
            Calc sheet PDF
          </a>
          <Button size="sm" onClick={() => download('elements', elementTable(doc, check))}>
            Element table CSV
          </Button>
          <Button size="sm" onClick={() => download('cut-list', cutListTable(sheet))}>
            Cut list CSV
          </Button>
          <Button size="sm" onClick={() => download('bom', bomTable(sheet))}>
            Bill of materials CSV
          </Button>
          <Button size="sm" variant="primary" onClick={() => window.print()}>
            Print
          </Button>
        </div>
      </div>
      <CautionNote />
      {spool.status !== 'released' ? (
        <p
          role="status"
          className="rounded border border-amber-300 bg-amber-50 px-2 py-1 text-sm text-amber-900"
        >
          This revision is not released for fabrication (state: {spool.status}).
        </p>
      ) : null}
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-6">
        <Figure
          label={`Developed length (${u.length})`}
          value={n(sheet.developedLength)}
          testId="developed-length"
        />
        <Figure label={`Pipe to order (${u.length})`} value={n(sheet.orderLength)} />
        <Figure label="Butt welds" value={sheet.welds} />
        <Figure label={`Mass empty (${m.mass})`} value={n(sheet.totalMass)} testId="mass-empty" />
        <Figure
          label={`Mass full of water (${m.mass})`}
          value={n(sheet.filledMass)}
          testId="mass-filled"
        />
        <Figure label={`Hydrotest (${u.pressure})`} value={n(sheet.hydrotest?.pressure)} />
      </div>
      <Section title="Bend list" id="bend-list">
        <BendList sheet={sheet} />
      </Section>
      <Section title="Cut list" id="cut-list">
        <CutList sheet={sheet} legs={legs} />
      </Section>
      <Section title="Bill of materials" id="bom">
        <BillOfMaterials sheet={sheet} />
        <p className="mt-1 text-xs text-steel-600">
          Mass from the ring area and the material density (carbon steel 7850 kg/m³, the basis of
          the ASME B36.10M plain-end formula 10.69·(D − t)·t lb/ft). Spool mass is the pipe as built
          (developed length, walls as ordered); water {n(sheet.waterDensity.value)} kg/m³.
        </p>
      </Section>
      <Section title="Hydrotest (B31.3 para. 345.4.2)" id="hydrotest">
        <HydrotestPanel sheet={sheet} />
      </Section>
      {elementNotes.length + sheet.notes.length + sheet.skipped.length > 0 ? (
        <Section title="Notes" id="notes">
          <ul className="list-disc pl-5 text-xs text-steel-700" data-testid="sheet-notes">
            {sheet.skipped.map((s) => (
              <li key={`skip-${s.id}`} className="text-red-800">
                {s.id}: cannot be checked — {s.reason}
              </li>
            ))}
            {[...elementNotes, ...sheet.notes].map((t) => (
              <li key={t}>{t}</li>
            ))}
          </ul>
        </Section>
      ) : null}
      <CautionNote className="hidden print:block" />
    </div>
  );
}

function FabricationScreen({ spool }: { spool: Spool }) {
  const materials = useMaterials();
  const parsed = useMemo(() => parseSpoolDocument(spool.document), [spool.document]);
  const options = useMemo(() => {
    const team = materials.data?.filter((m) => m.origin === 'team') ?? [];
    return team.length > 0 ? { findMaterial: createMaterialLookup(team) } : undefined;
  }, [materials.data]);
  const result = useMemo(() => {
    if (!parsed.ok) return null;
    const check = checkSpool(parsed.doc, options);
    return { check, sheet: buildFabricationSheet(parsed.doc, check, options) };
  }, [parsed, options]);
  useDocumentTitle(`Fabrication · ${spool.document.name || 'Spool'} · Spoolwright`);
  if (materials.isPending) return <LoadingLine label="Loading materials…" />;
  if (!parsed.ok || !result) {
    return (
      <div
        role="alert"
        className="m-4 rounded border border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800"
      >
        The stored spool document is not valid:
        <ul className="list-disc pl-5 font-mono text-xs">
          {(parsed.ok ? [] : parsed.issues).map((i) => (
            <li key={i.path}>
              {i.path}: {i.message}
            </li>
          ))}
        </ul>
      </div>
    );
  }
  return (
    <FabricationSheetView
      spool={spool}
      doc={parsed.doc}
      check={result.check}
      sheet={result.sheet}
    />
  );
}

/** `/spools/:spoolId/fabrication`: the printable fabrication sheet, for every role. */
export function FabricationPage() {
  const { spoolId = '' } = useParams();
  const query = useSpool(spoolId);
  if (query.isPending) return <LoadingLine label="Opening the fabrication sheet…" />;
  if (query.isError)
    return (
      <div className="p-6">
        <ErrorLine error={query.error} />
      </div>
    );
  return (
    <div className="h-full overflow-auto bg-steel-50 print:h-auto print:overflow-visible print:bg-white">
      <FabricationScreen spool={query.data} />
    </div>
  );
}
