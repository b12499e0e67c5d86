import { Link } from 'react-router-dom';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { formatDateTime } from '@/lib/format';
import { useWaiting } from '../api/get-waiting';
import type { Waiting } from '../api/review-schemas';

/** What each role's queue holds, in its own words. */
export const WAITING_TITLES: Record<string, { title: string; empty: string }> = {
  designer: { title: 'Returned to you', empty: 'No spool has been returned to its designer.' },
  checker: { title: 'Submitted for check', empty: 'No spool is waiting for a check.' },
  lead: { title: 'Checked, awaiting release', empty: 'No checked spool is waiting for release.' },
  admin: { title: 'Checked, awaiting release', empty: 'No checked spool is waiting for release.' },
  fabricator: { title: 'Released for fabrication', empty: 'No spool has been released yet.' },
};

const spoolHref = (id: string, elementId?: string | null) =>
  `/spools/${encodeURIComponent(id)}${elementId ? `?element=${encodeURIComponent(elementId)}&panel=review` : '?panel=review'}`;

/** The rows of a waiting list (separate from the query for tests). */
export function WaitingRows({ waiting }: { readonly waiting: Waiting }) {
  const look = WAITING_TITLES[waiting.role] ?? {
    title: 'Waiting on you',
    empty: 'Nothing is waiting.',
  };
  if (waiting.items.length === 0) return <p className="text-sm text-steel-500">{look.empty}</p>;
  return (
    <ul
      className="flex flex-col divide-y divide-steel-100 rounded border border-steel-200 bg-white"
      data-testid="waiting-list"
    >
      {waiting.items.map((w) => (
        <li
          key={w.spool.id}
          data-waiting-spool={w.spool.id}
          className="flex flex-col gap-1 px-3 py-2 text-sm"
        >
          <div className="flex flex-wrap items-center gap-3">
            <Link
              to={
                waiting.role === 'fabricator'
                  ? `/spools/${encodeURIComponent(w.spool.id)}/fabrication`
                  : spoolHref(w.spool.id)
              }
              className="font-medium text-steel-900 underline-offset-2 hover:text-copper-600 hover:underline"
            >
              {w.spool.name || '(unnamed)'}
            </Link>
            <span className="text-steel-500">{w.spool.line || '—'}</span>
            <span className="text-xs text-steel-500">rev. {w.spool.revision}</span>
            <LifecycleBadge status={w.spool.status} />
            <CheckBadge status={w.spool.worst?.status ?? null} />
            {w.openComments > 0 ? (
              <span
                className="rounded-full bg-violet-700 px-2 py-px text-xs font-semibold text-white"
                data-testid="waiting-open-comments"
              >
                {w.openComments} open comment{w.openComments === 1 ? '' : 's'}
              </span>
            ) : null}
            <span className="ml-auto text-xs text-steel-500">
              {w.since
                ? `since ${formatDateTime(w.since)}`
                : `saved ${formatDateTime(w.spool.updatedAt)}`}
            </span>
          </div>
          {/* A return note is also a comment of the revision: show it once. */}
          {w.note && !w.comments?.some((c) => c.body === w.note) ? (
            <p className="text-xs text-steel-600">“{w.note}”</p>
          ) : null}
          {w.comments && w.comments.length > 0 ? (
            <ul className="flex flex-col gap-0.5 pl-3 text-xs">
              {w.comments.map((c) => (
                <li key={c.id} className="flex gap-2">
                  <Link
                    to={spoolHref(w.spool.id, c.elementId)}
                    className="shrink-0 font-mono text-copper-600 hover:underline"
                  >
                    {c.elementId ?? 'spool'}
                  </Link>
                  <span className="truncate text-steel-700">{c.body}</span>
                </li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

/** "Waiting on me" on the register: the signed-in role's queue, each row linking into its spool. */
export function WaitingList() {
  const query = useWaiting();
  const look = query.data ? WAITING_TITLES[query.data.role] : undefined;
  return (
    <section aria-label="Waiting on me" id="waiting" className="flex flex-col gap-2">
      <h2 className="flex items-baseline gap-2 text-base font-semibold text-steel-800">
        Waiting on me
        {look ? <span className="text-sm font-normal text-steel-500">{look.title}</span> : null}
        {query.data ? (
          <span
            className="rounded-full bg-steel-200 px-2 text-xs text-steel-700"
            data-testid="waiting-total"
          >
            {query.data.total}
          </span>
        ) : null}
      </h2>
      {query.isPending ? (
        <LoadingLine />
      ) : query.isError ? (
        <ErrorLine error={query.error} />
      ) : (
        <WaitingRows waiting={query.data} />
      )}
    </section>
  );
}

/** The count in the header, linking to the list. */
export function WaitingCount() {
  const query = useWaiting();
  const n = query.data?.total;
  if (n === undefined) return null;
  return (
    <Link
      to="/spools#waiting"
      data-testid="waiting-count"
      title={`${n} spool${n === 1 ? '' : 's'} waiting on you`}
      className="flex items-center gap-1 rounded px-2 py-1 text-sm hover:bg-steel-700"
    >
      Waiting on me
      <span
        className={
          n > 0
            ? 'rounded-full bg-copper-500 px-1.5 text-xs font-semibold text-white'
            : 'rounded-full bg-steel-600 px-1.5 text-xs text-steel-200'
        }
      >
        {n}
      </span>
    </Link>
  );
}
