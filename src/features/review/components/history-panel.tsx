import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { checkSpool, type CheckOptions } from '@shared/engine';
import { inputClass } from '@/components/ui/field';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { cn } from '@/lib/cn';
import { formatDateTime } from '@/lib/format';
import { useEvents } from '../api/get-events';
import { useRevision } from '../api/get-revision';
import { useRevisions } from '../api/get-revisions';
import type { Revision } from '../api/review-schemas';
import { diffRevisions, formatDiffValue, isEmptyDiff, type RevisionDiff } from '../revision-diff';

const STATE_LABEL: Record<string, string> = {
  draft: 'draft',
  submitted: 'submitted',
  checked: 'checked',
  released: 'released',
};

/** The comparison of two revisions as lists (added, removed, changed with old → new, status changes). */
export function RevisionDiffView({ diff }: { readonly diff: RevisionDiff }) {
  if (isEmptyDiff(diff))
    return (
      <p className="text-sm text-steel-500" data-testid="revision-diff">
        Revisions {diff.from} and {diff.to} are the same.
      </p>
    );
  return (
    <div className="flex flex-col gap-2 text-xs" data-testid="revision-diff">
      <p className="text-steel-600">
        From revision {diff.from} to revision {diff.to}:
      </p>
      {diff.added.length > 0 ? (
        <section aria-label="Added elements">
          <h4 className="font-semibold text-emerald-800">Added ({diff.added.length})</h4>
          <ul className="list-disc pl-5 font-mono">
            {diff.added.map((e) => (
              <li key={e.id}>
                {e.id} ({e.kind})
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {diff.removed.length > 0 ? (
        <section aria-label="Removed elements">
          <h4 className="font-semibold text-red-800">Removed ({diff.removed.length})</h4>
          <ul className="list-disc pl-5 font-mono">
            {diff.removed.map((e) => (
              <li key={e.id}>
                {e.id} ({e.kind})
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {diff.changed.length > 0 ? (
        <section aria-label="Changed">
          <h4 className="font-semibold text-steel-800">Changed ({diff.changed.length})</h4>
          <table className="w-full">
            <thead className="text-left text-steel-500">
              <tr>
                <th className="pr-2 font-medium">where</th>
                <th className="pr-2 font-medium">field</th>
                <th className="font-medium">old → new</th>
              </tr>
            </thead>
            <tbody className="font-mono">
              {diff.changed.flatMap((c) =>
                c.fields.map((f) => (
                  <tr
                    key={`${c.target}.${f.field}`}
                    className="border-t border-steel-100"
                    data-change={`${c.target}.${f.field}`}
                  >
                    <td className="pr-2 align-top">{c.target}</td>
                    <td className="pr-2 align-top">{f.field}</td>
                    <td className="break-all">
                      {formatDiffValue(f.before)} → {formatDiffValue(f.after)}
                    </td>
                  </tr>
                )),
              )}
            </tbody>
          </table>
        </section>
      ) : null}
      {diff.statusChanges.length > 0 ? (
        <section aria-label="Check status changes">
          <h4 className="font-semibold text-steel-800">
            Check status ({diff.statusChanges.length})
          </h4>
          <ul className="flex flex-col gap-0.5">
            {diff.statusChanges.map((s) => (
              <li key={s.id} className="flex items-center gap-1" data-status-change={s.id}>
                <code>{s.id}</code> <CheckBadge status={s.before} /> →{' '}
                <CheckBadge status={s.after} />
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}

function Compare({
  spoolId,
  revisions,
  checkOptions,
}: {
  spoolId: string;
  revisions: readonly number[];
  checkOptions: CheckOptions | undefined;
}) {
  const last = revisions.at(-1) ?? 0;
  const [from, setFrom] = useState<number>(revisions.length > 1 ? revisions.at(-2)! : last);
  const [to, setTo] = useState<number>(last);
  const a = useRevision(spoolId, from);
  const b = useRevision(spoolId, to);
  const diff = useMemo(() => {
    if (!a.data || !b.data) return null;
    const side = (r: Revision) => ({
      revision: r.revision,
      document: r.document,
      check: checkSpool(r.document, checkOptions),
    });
    return diffRevisions(side(a.data), side(b.data));
  }, [a.data, b.data, checkOptions]);
  return (
    <section
      aria-label="Compare revisions"
      className="flex flex-col gap-2 rounded border border-steel-200 p-2"
    >
      <h3 className="text-xs font-semibold uppercase tracking-wide text-steel-600">
        Compare revisions
      </h3>
      <div className="flex items-center gap-2 text-xs">
        <label htmlFor="compare-from">from</label>
        <select
          id="compare-from"
          className={cn(inputClass, 'h-7 w-20 text-xs')}
          value={from}
          onChange={(e) => setFrom(Number(e.target.value))}
        >
          {revisions.map((r) => (
            <option key={r} value={r}>
              rev. {r}
            </option>
          ))}
        </select>
        <label htmlFor="compare-to">to</label>
        <select
          id="compare-to"
          className={cn(inputClass, 'h-7 w-20 text-xs')}
          value={to}
          onChange={(e) => setTo(Number(e.target.value))}
        >
          {revisions.map((r) => (
            <option key={r} value={r}>
              rev. {r}
            </option>
          ))}
        </select>
      </div>
      {a.isError ? (
        <ErrorLine error={a.error} />
      ) : b.isError ? (
        <ErrorLine error={b.error} />
      ) : diff ? (
        <RevisionDiffView diff={diff} />
      ) : (
        <LoadingLine label="Comparing…" />
      )}
    </section>
  );
}

/** The spool's events (who, when, from → to, note) and revisions, each revision openable read-only; a comparison of two. */
export function HistoryPanel({
  spoolId,
  checkOptions,
}: {
  readonly spoolId: string;
  readonly checkOptions?: CheckOptions | undefined;
}) {
  const events = useEvents(spoolId);
  const revisions = useRevisions(spoolId);
  return (
    <div className="flex flex-col gap-4 p-3" data-testid="history-panel">
      <section aria-label="Revisions" className="flex flex-col gap-1">
        <h2 className="text-base font-semibold text-steel-800">Revisions</h2>
        {revisions.isPending ? (
          <LoadingLine />
        ) : revisions.isError ? (
          <ErrorLine error={revisions.error} />
        ) : null}
        <ul className="flex flex-col gap-1 text-sm">
          {(revisions.data ?? []).map((r) => (
            <li
              key={r.revision}
              data-revision={r.revision}
              className="flex flex-wrap items-center gap-2 rounded border border-steel-200 px-2 py-1"
            >
              <strong>rev. {r.revision}</strong>
              <LifecycleBadge status={r.status} />
              <span className="text-xs text-steel-500">
                {r.current
                  ? 'current'
                  : r.frozenAt
                    ? `frozen ${formatDateTime(r.frozenAt)}${r.frozenBy ? ` by ${r.frozenBy.name}` : ''}`
                    : ''}
              </span>
              <span className="text-xs text-steel-500">
                {r.summary.fail} fail · {r.summary.marginal} marginal
              </span>
              <Link
                className="ml-auto text-xs font-medium text-copper-600 underline"
                to={`/spools/${encodeURIComponent(spoolId)}/revisions/${r.revision}`}
              >
                Open read-only
              </Link>
            </li>
          ))}
        </ul>
      </section>
      {revisions.data && revisions.data.length > 0 ? (
        <Compare
          spoolId={spoolId}
          revisions={revisions.data.map((r) => r.revision)}
          checkOptions={checkOptions}
        />
      ) : null}
      <section aria-label="Events" className="flex flex-col gap-1">
        <h2 className="text-base font-semibold text-steel-800">Events</h2>
        {events.isPending ? (
          <LoadingLine />
        ) : events.isError ? (
          <ErrorLine error={events.error} />
        ) : null}
        {events.data && events.data.length === 0 ? (
          <p className="text-sm text-steel-500">No state changes yet.</p>
        ) : null}
        <ol className="flex flex-col gap-1 text-sm">
          {[...(events.data ?? [])].reverse().map((e) => (
            <li
              key={e.id}
              data-testid="event"
              className="rounded border border-steel-200 px-2 py-1"
            >
              <div className="flex flex-wrap items-center gap-1.5 text-xs">
                <span className="font-semibold text-steel-800">
                  {e.user?.name ?? 'former member'}
                </span>
                <time className="text-steel-500" dateTime={e.createdAt}>
                  {formatDateTime(e.createdAt)}
                </time>
                <span className="text-steel-500">rev. {e.revision}</span>
                <span data-testid="event-move">
                  {STATE_LABEL[e.from] ?? e.from} → {STATE_LABEL[e.to] ?? e.to}
                </span>
              </div>
              {e.note ? (
                <p className="mt-0.5 text-sm whitespace-pre-wrap text-steel-700">“{e.note}”</p>
              ) : null}
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
