import { useMemo } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { createMaterialLookup } from '@shared/data/materials';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { LifecycleBadge } from '@/components/ui/status-badge';
import { formatDateTime } from '@/lib/format';
import { useMaterials } from '@/features/sketch/api/get-materials';
import { useRevision } from '../api/get-revision';
import { ReadOnlySketch } from './read-only-sketch';

/** One revision of a spool, read-only in the sketcher's canvas, list and inspector (/spools/:id/revisions/:rev). */
export function RevisionPage() {
  const { spoolId = '', rev = '' } = useParams();
  const [params] = useSearchParams();
  const revision = /^\d+$/.test(rev) ? Number(rev) : null;
  const query = useRevision(spoolId, revision);
  const materials = useMaterials();
  const checkOptions = useMemo(() => {
    const team = materials.data?.filter((m) => m.origin === 'team') ?? [];
    return team.length > 0 ? { findMaterial: createMaterialLookup(team) } : undefined;
  }, [materials.data]);
  if (revision === null)
    return (
      <div className="p-6">
        <ErrorLine error={new Error(`"${rev}" is not a revision number`)} />
      </div>
    );
  if (query.isPending || materials.isPending)
    return <LoadingLine label={`Opening revision ${revision}…`} />;
  if (query.isError)
    return (
      <div className="flex flex-col gap-2 p-6">
        <ErrorLine error={query.error} />
        <Link
          className="text-sm text-copper-600 underline"
          to={`/spools/${encodeURIComponent(spoolId)}`}
        >
          Back to the spool
        </Link>
      </div>
    );
  const r = query.data;
  const banner = (
    <div
      role="status"
      data-testid="revision-banner"
      data-revision={r.revision}
      className="flex flex-wrap items-center gap-3 border-b-2 border-violet-600 bg-violet-50 px-3 py-2 text-sm text-violet-950"
    >
      <strong className="font-semibold">
        {r.name} · revision {r.revision}
      </strong>
      <LifecycleBadge status={r.status} />
      {r.line ? <span className="text-violet-900">line {r.line}</span> : null}
      <span className="rounded bg-violet-700 px-1.5 py-px text-xs font-semibold uppercase tracking-wide text-white">
        Read-only
      </span>
      <span className="text-xs text-violet-900">
        {r.current
          ? 'This is the current revision, shown without editing.'
          : `An earlier revision, as frozen ${formatDateTime(r.updatedAt)}. Nothing here can be changed.`}
      </span>
      <Link
        to={`/spools/${encodeURIComponent(spoolId)}`}
        className="ml-auto rounded border border-violet-400 bg-white px-2 py-0.5 text-xs font-medium text-violet-800 hover:bg-violet-100"
      >
        ← Back to the current revision
      </Link>
    </div>
  );
  return (
    <ReadOnlySketch
      key={`${spoolId}-${r.revision}`}
      document={r.document}
      checkOptions={checkOptions}
      banner={banner}
      selectId={params.get('element')}
    />
  );
}
