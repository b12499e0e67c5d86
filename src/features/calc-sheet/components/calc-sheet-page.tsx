import { useMemo } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { createMaterialLookup } from '@shared/data/materials';
import { checkSpool } from '@shared/engine/index';
import { CAUTION } from '@shared/model/caution';
import { buildCalcSheet } from '@shared/report/calc-sheet';
import { Button } from '@/components/ui/button';
import { CautionNote } from '@/components/ui/caution-note';
import { inputClass } from '@/components/ui/field';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useMe } from '@/features/auth/api/get-me';
import { useMaterials } from '@/features/sketch/api/get-materials';
import { API_BASE } from '@/lib/api';
import { cn } from '@/lib/cn';
import { useRevision } from '../api/get-revision';
import { useRevisions } from '../api/get-revisions';
import { useSpoolEvents } from '../api/get-spool-events';
import { CalcSheetView } from './calc-sheet-view';
import './calc-sheet-print.css';

/** The caution in the bottom margin of every printed page (a CSS string: quotes and backslashes escaped). */
const printCautionCss = `@media print { @page { @bottom-left { content: "Caution. ${CAUTION.replace(/["\\]/g, '\\$&')}"; font-family: Barlow, sans-serif; font-size: 7pt; color: #364151; width: 78%; vertical-align: top; padding-top: 3mm; } } }`;

/** Address of the PDF of a revision (the server draws it from the same model). */
export const calcSheetPdfUrl = (spoolId: string, revision: number) =>
  `${API_BASE}/spools/${encodeURIComponent(spoolId)}/calc-sheet.pdf?revision=${revision}`;

/** /spools/:spoolId/calc-sheet?revision=N — the calc sheet of a revision, printable, with its PDF. */
export function CalcSheetPage() {
  const { spoolId = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const revisions = useRevisions(spoolId);
  const current = revisions.data?.find((r) => r.current);
  const asked = params.get('revision');
  const askedNumber = asked !== null && /^\d+$/.test(asked) ? Number(asked) : undefined;
  const known =
    askedNumber === undefined || (revisions.data?.some((r) => r.revision === askedNumber) ?? true);
  const revisionNumber = askedNumber ?? current?.revision;
  const revision = useRevision(spoolId, known ? revisionNumber : undefined);
  const events = useSpoolEvents(spoolId);
  const materials = useMaterials();
  const me = useMe();

  const sheet = useMemo(() => {
    if (!revision.data || !events.data || !materials.data) return null;
    const team = materials.data.filter((m) => m.origin === 'team');
    const check = checkSpool(
      revision.data.document,
      team.length > 0 ? { findMaterial: createMaterialLookup(team) } : {},
    );
    return buildCalcSheet({
      team: me.data?.team?.name ?? null,
      revision: revision.data.revision,
      state: revision.data.status,
      document: revision.data.document,
      check,
      history: events.data,
      generatedAt: new Date().toISOString(),
    });
  }, [revision.data, events.data, materials.data, me.data]);

  const error = revisions.error ?? revision.error ?? events.error ?? materials.error;
  return (
    <div className="calc-sheet-page h-full overflow-auto bg-steel-100">
      <style>{printCautionCss}</style>
      <div className="cs-no-print sticky top-0 z-10 flex flex-wrap items-center gap-3 border-b border-steel-200 bg-steel-50 px-4 py-2">
        <Link
          to={`/spools/${encodeURIComponent(spoolId)}`}
          className="text-sm text-copper-600 hover:underline"
        >
          ← Back to the sketch
        </Link>
        <h1 className="text-sm font-semibold text-steel-800">Calc sheet</h1>
        {revisions.data ? (
          <label className="flex items-center gap-1 text-xs text-steel-600">
            Revision
            <select
              aria-label="Revision"
              className={cn(inputClass, 'h-7 w-auto py-0 text-xs')}
              value={revisionNumber ?? ''}
              onChange={(e) => setParams({ revision: e.target.value }, { replace: true })}
            >
              {revisions.data.map((r) => (
                <option key={r.revision} value={r.revision}>
                  rev. {r.revision} · {r.status}
                  {r.current ? ' (current)' : ''}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <div className="ml-auto flex items-center gap-2">
          <Button size="sm" onClick={() => window.print()} disabled={!sheet}>
            Print
          </Button>
          {revisionNumber !== undefined && known ? (
            <a
              href={calcSheetPdfUrl(spoolId, revisionNumber)}
              download
              className="inline-flex h-7 items-center rounded bg-copper-500 px-2 text-xs font-medium text-white hover:bg-copper-600"
              data-testid="download-pdf"
            >
              Download PDF
            </a>
          ) : null}
        </div>
      </div>
      <div className="cs-paper mx-auto my-4 max-w-4xl rounded border border-steel-200 bg-white p-6 shadow-sm">
        {!known ? (
          <ErrorLine error={new Error(`Revision ${asked ?? ''} of this spool does not exist`)} />
        ) : error ? (
          <ErrorLine error={error} />
        ) : !sheet ? (
          <LoadingLine label="Preparing the calc sheet…" />
        ) : (
          <div className="flex flex-col gap-4">
            <CautionNote className="cs-no-print" />
            <CalcSheetView sheet={sheet} />
            <CautionNote className="cs-no-print" />
          </div>
        )}
      </div>
    </div>
  );
}
