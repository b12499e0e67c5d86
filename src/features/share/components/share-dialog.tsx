import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { cn } from '@/lib/cn';
import { formatDateTime } from '@/lib/format';
import { useRevisions } from '@/features/review/api/get-revisions';
import { useCreateShare } from '../api/create-share';
import { useShares } from '../api/get-shares';
import { useRevokeShare } from '../api/revoke-share';
import { shareState, type CreatedShare } from '../api/share-schemas';

export interface ShareDialogProps {
  readonly spoolId: string;
  readonly spoolName: string;
  readonly currentRevision: number;
  readonly onClose: () => void;
}

const STATE_LOOK = {
  active: 'bg-emerald-100 text-emerald-800',
  expired: 'bg-steel-200 text-steel-700',
  revoked: 'bg-red-100 text-red-800',
} as const;

/** Parse the expiry field: whole days 1–365, or a message naming the field. */
export function readExpiryDays(
  text: string,
): { ok: true; days: number } | { ok: false; message: string } {
  const t = text.trim();
  if (!/^\d+$/.test(t))
    return { ok: false, message: 'Expires in (days): a whole number of days, 1 to 365' };
  const days = Number(t);
  if (days < 1 || days > 365) return { ok: false, message: 'Expires in (days): between 1 and 365' };
  return { ok: true, days };
}

async function copyText(text: string, fallback: HTMLInputElement | null): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    // Clipboard API refused (no permission, insecure origin): select the text for Ctrl+C.
    fallback?.select();
    return false;
  }
}

/** Create, copy and revoke read-only links to a revision of one spool (lead, admin). */
export function ShareDialog({ spoolId, spoolName, currentRevision, onClose }: ShareDialogProps) {
  const revisions = useRevisions(spoolId);
  const shares = useShares(spoolId);
  const create = useCreateShare();
  const revoke = useRevokeShare();
  const [revision, setRevision] = useState(currentRevision);
  const [days, setDays] = useState('30');
  const [error, setError] = useState<string | null>(null);
  const [created, setCreated] = useState<CreatedShare | null>(null);
  const [copied, setCopied] = useState<'yes' | 'select' | null>(null);
  const linkRef = useRef<HTMLInputElement>(null);
  const dialogRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    dialogRef.current?.focus();
  }, []);

  const submit = () => {
    const d = readExpiryDays(days);
    if (!d.ok) {
      setError(d.message);
      return;
    }
    setError(null);
    setCopied(null);
    create.mutate(
      { spoolId, revision, expiresInDays: d.days },
      { onSuccess: (s) => setCreated(s) },
    );
  };

  return (
    <div
      className="fixed inset-0 z-40 flex items-start justify-center bg-steel-900/40 p-8"
      onMouseDown={(e) => e.target === e.currentTarget && onClose()}
    >
      <div
        ref={dialogRef}
        tabIndex={-1}
        role="dialog"
        aria-modal="true"
        aria-label="Share spool"
        className="flex max-h-full w-[40rem] flex-col gap-3 overflow-auto rounded-lg bg-white p-4 font-sans shadow-xl outline-none"
        onKeyDown={(e) => {
          if (e.key === 'Escape') onClose();
        }}
      >
        <header className="flex items-baseline gap-2">
          <h2 className="text-lg font-semibold text-steel-800">Share “{spoolName}”</h2>
          <Button
            size="sm"
            variant="ghost"
            className="ml-auto"
            onClick={onClose}
            aria-label="Close"
          >
            ✕
          </Button>
        </header>
        <p className="text-sm text-steel-600">
          A link opens this revision read-only for anyone who has it, without an account, until it
          expires or is revoked.
        </p>
        <form
          aria-label="New share link"
          noValidate
          className="flex flex-wrap items-end gap-3 rounded border border-steel-200 p-3"
          onSubmit={(e) => {
            e.preventDefault();
            submit();
          }}
        >
          <label className="flex flex-col gap-1 text-xs font-medium text-steel-600">
            Revision
            <select
              aria-label="Revision"
              className={cn(inputClass, 'h-8 w-40')}
              value={revision}
              onChange={(e) => setRevision(Number(e.target.value))}
            >
              {(revisions.data ?? [{ revision: currentRevision, current: true, status: '' }]).map(
                (r) => (
                  <option key={r.revision} value={r.revision}>
                    rev. {r.revision}
                    {r.current ? ' (current)' : ''} {r.status}
                  </option>
                ),
              )}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-steel-600">
            Expires in (days)
            <input
              aria-label="Expires in (days)"
              inputMode="numeric"
              className={cn(inputClass, 'h-8 w-24', error && 'border-red-400')}
              aria-invalid={error ? true : undefined}
              value={days}
              onChange={(e) => setDays(e.target.value)}
            />
          </label>
          <Button type="submit" variant="primary" disabled={create.isPending}>
            {create.isPending ? 'Creating…' : 'Create link'}
          </Button>
          {error ? (
            <p role="alert" className="w-full text-xs text-red-700">
              {error}
            </p>
          ) : null}
          {create.isError ? (
            <div className="w-full">
              <ErrorLine error={create.error} />
            </div>
          ) : null}
        </form>
        {created ? (
          <div
            className="flex flex-col gap-1 rounded border border-emerald-300 bg-emerald-50 p-3 text-sm"
            data-testid="new-share"
          >
            <p className="font-semibold text-emerald-900">
              Link to revision {created.revision}, valid until {formatDateTime(created.expiresAt)}.
              It is shown only now: copy it before closing.
            </p>
            <div className="flex gap-2">
              <input
                ref={linkRef}
                readOnly
                aria-label="Share link"
                className={cn(inputClass, 'h-8 flex-1 font-mono text-xs')}
                value={created.url}
                onFocus={(e) => e.target.select()}
              />
              <Button
                variant="primary"
                onClick={() => {
                  void copyText(created.url, linkRef.current).then((ok) =>
                    setCopied(ok ? 'yes' : 'select'),
                  );
                }}
              >
                Copy link
              </Button>
            </div>
            {copied === 'yes' ? (
              <p className="text-xs text-emerald-800">Copied to the clipboard.</p>
            ) : null}
            {copied === 'select' ? (
              <p className="text-xs text-amber-800">
                The browser did not allow copying: the link is selected, press Ctrl+C.
              </p>
            ) : null}
          </div>
        ) : null}
        <section aria-label="Links of this spool" className="flex flex-col gap-1">
          <h3 className="text-xs font-semibold uppercase tracking-wide text-steel-600">
            Links of this spool
          </h3>
          {shares.isPending ? (
            <LoadingLine />
          ) : shares.isError ? (
            <ErrorLine error={shares.error} />
          ) : null}
          {shares.data && shares.data.length === 0 ? (
            <p className="text-sm text-steel-500">No links yet.</p>
          ) : null}
          {revoke.isError ? <ErrorLine error={revoke.error} /> : null}
          <table className="w-full text-xs" data-testid="share-list">
            <thead className="text-left text-steel-500">
              <tr>
                <th className="py-1 font-medium">state</th>
                <th className="font-medium">rev.</th>
                <th className="font-medium">made by, when</th>
                <th className="font-medium">expires</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {(shares.data ?? []).map((s) => {
                const state = shareState(s);
                return (
                  <tr
                    key={s.id}
                    data-share-id={s.id}
                    data-state={state}
                    className="border-t border-steel-100"
                  >
                    <td className="py-1">
                      <span className={cn('rounded px-1.5 py-px font-medium', STATE_LOOK[state])}>
                        {state}
                      </span>
                    </td>
                    <td>{s.revision}</td>
                    <td>
                      {s.createdBy?.name ?? 'former member'}, {formatDateTime(s.createdAt)}
                    </td>
                    <td>
                      {state === 'revoked' && s.revokedAt
                        ? `revoked ${formatDateTime(s.revokedAt)}`
                        : formatDateTime(s.expiresAt)}
                    </td>
                    <td className="text-right">
                      {state === 'active' ? (
                        <Button
                          size="sm"
                          variant="danger"
                          disabled={revoke.isPending}
                          onClick={() => revoke.mutate({ spoolId, shareId: s.id })}
                        >
                          Revoke
                        </Button>
                      ) : null}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </section>
      </div>
    </div>
  );
}
