import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { PageFrame, Panel } from '@/components/ui/page-frame';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { isApiError } from '@/lib/api';
import { formatDateTime } from '@/lib/format';
import { cn } from '@/lib/cn';
import { useOutbox } from '../api/get-outbox';

/** One-use link tokens are not shown to the admin, whatever the server sends (the addressee's mailbox has them). */
export const hideTokens = (text: string) => text.replace(/([?&]token=)[^\s&]+/g, '$1[hidden]');

/** Mail the server sent to the team, as the development mail catcher received it (admins). */
export function OutboxPage() {
  const [limit, setLimit] = useState(50);
  const outbox = useOutbox(limit);
  const [open, setOpen] = useState<string | null>(null);
  const noOutbox = outbox.isError && isApiError(outbox.error) && outbox.error.status === 404;

  return (
    <PageFrame
      title="Outbox"
      intro="Mail the server sent, newest first, as the development mail catcher received it. One-use links (invitations, password resets) are hidden: they are for the addressee alone."
      actions={
        <Button size="sm" onClick={() => void outbox.refetch()} disabled={outbox.isFetching}>
          {outbox.isFetching ? 'Refreshing…' : 'Refresh'}
        </Button>
      }
    >
      <Panel title="Messages">
        {outbox.isPending ? <LoadingLine /> : null}
        {noOutbox ? (
          <p className="text-sm text-steel-600">
            This server sends mail through an SMTP server, so there is no outbox to show.
          </p>
        ) : outbox.isError ? (
          <ErrorLine error={outbox.error} />
        ) : null}
        {outbox.data && outbox.data.length === 0 ? (
          <p className="text-sm text-steel-500">No mail yet.</p>
        ) : null}
        {outbox.data && outbox.data.length > 0 ? (
          <ul className="flex flex-col divide-y divide-steel-100" data-testid="outbox">
            {outbox.data.map((m) => {
              const key = String(m.id);
              const expanded = open === key;
              return (
                <li key={key} data-mail-to={m.to}>
                  <button
                    type="button"
                    aria-expanded={expanded}
                    className="grid w-full grid-cols-[12rem_1fr_10rem] gap-3 px-1 py-2 text-left text-sm hover:bg-steel-50"
                    onClick={() => setOpen(expanded ? null : key)}
                  >
                    <span className="truncate text-steel-700" title={m.to}>
                      {m.to}
                    </span>
                    <span className={cn('truncate text-steel-900', expanded && 'font-medium')}>
                      {m.subject}
                    </span>
                    <span className="text-right tabular-nums text-steel-500">
                      {formatDateTime(m.createdAt)}
                    </span>
                  </button>
                  {expanded ? (
                    <div className="mb-2 rounded border border-steel-200 bg-steel-50 p-3 text-sm">
                      <p className="mb-2 text-xs text-steel-500">
                        From {m.from} · to {m.to} · {formatDateTime(m.createdAt)}
                      </p>
                      <pre className="whitespace-pre-wrap break-words font-sans text-steel-800">
                        {hideTokens(m.text)}
                      </pre>
                    </div>
                  ) : null}
                </li>
              );
            })}
          </ul>
        ) : null}
        {outbox.data && outbox.data.length >= limit && limit < 500 ? (
          <Button
            size="sm"
            variant="ghost"
            className="mt-2"
            onClick={() => setLimit((l) => Math.min(500, l * 2))}
          >
            Show more
          </Button>
        ) : null}
      </Panel>
    </PageFrame>
  );
}
