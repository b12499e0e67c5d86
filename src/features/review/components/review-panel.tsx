import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { cn } from '@/lib/cn';
import { formatDateTime } from '@/lib/format';
import { useComments } from '../api/get-comments';
import { useCreateComment } from '../api/create-comment';
import { useUpdateComment } from '../api/update-comment';
import type { ReviewComment } from '../api/review-schemas';

export type CommentFilter = 'open' | 'resolved' | 'all';

export interface CommentThread {
  /** The element the thread is pinned to, or null for the whole spool. */
  readonly elementId: string | null;
  readonly comments: readonly ReviewComment[];
  readonly open: number;
}

const matches = (c: ReviewComment, f: CommentFilter) =>
  f === 'all' || (f === 'open' ? c.resolvedAt === null : c.resolvedAt !== null);

/**
 * Comments as threads: one for the whole spool, one per element, in the order of their first
 * comment; each keeps the comments that pass the filter (oldest first), threads left empty are dropped.
 */
export function groupThreads(
  comments: readonly ReviewComment[],
  filter: CommentFilter,
): CommentThread[] {
  const byKey = new Map<string, ReviewComment[]>();
  for (const c of [...comments].sort((a, b) => a.id - b.id)) {
    const key = c.elementId ?? '';
    const list = byKey.get(key) ?? [];
    list.push(c);
    byKey.set(key, list);
  }
  const out: CommentThread[] = [];
  for (const [key, all] of byKey) {
    const shown = all.filter((c) => matches(c, filter));
    if (shown.length === 0) continue;
    out.push({
      elementId: key === '' ? null : key,
      comments: shown,
      open: all.filter((c) => c.resolvedAt === null).length,
    });
  }
  return out;
}

/** Open comments per element id (all revisions), for the canvas badges and the list markers. */
export function countOpenByElement(comments: readonly ReviewComment[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const c of comments)
    if (c.elementId && c.resolvedAt === null) out.set(c.elementId, (out.get(c.elementId) ?? 0) + 1);
  return out;
}

export interface ReviewPanelProps {
  readonly spoolId: string;
  /** The spool's current revision: comments of earlier ones are marked. */
  readonly revision: number;
  /** Element ids of the current document (a new comment may be pinned to one). */
  readonly elementIds: readonly string[];
  /** The selected element: its thread is highlighted and new comments are pinned to it. */
  readonly selectedId: string | null;
  readonly onSelectElement: (id: string) => void;
  readonly canComment: boolean;
}

function CommentItem({
  c,
  revision,
  spoolId,
  canComment,
}: {
  c: ReviewComment;
  revision: number;
  spoolId: string;
  canComment: boolean;
}) {
  const update = useUpdateComment();
  const earlier = c.revision < revision;
  return (
    <li
      data-testid="comment"
      data-comment-id={c.id}
      data-resolved={c.resolvedAt ? 'true' : 'false'}
      className={cn(
        'rounded border px-2 py-1.5',
        c.resolvedAt ? 'border-steel-200 bg-steel-50 text-steel-500' : 'border-violet-200 bg-white',
      )}
    >
      <div className="flex flex-wrap items-baseline gap-x-2 text-[11px] text-steel-500">
        <span className="font-semibold text-steel-700">{c.user?.name ?? 'former member'}</span>
        <time dateTime={c.createdAt}>{formatDateTime(c.createdAt)}</time>
        <span
          data-testid="comment-revision"
          className={cn(
            'rounded px-1',
            earlier ? 'bg-amber-100 text-amber-900' : 'bg-steel-100 text-steel-600',
          )}
        >
          rev. {c.revision}
          {earlier ? ' (earlier)' : ''}
        </span>
        {c.resolvedAt ? (
          <span className="text-emerald-700">
            resolved{c.resolvedBy ? ` by ${c.resolvedBy.name}` : ''} {formatDateTime(c.resolvedAt)}
          </span>
        ) : (
          <span className="font-medium text-violet-700">open</span>
        )}
      </div>
      <p className="mt-0.5 text-sm whitespace-pre-wrap text-steel-800">{c.body}</p>
      {canComment ? (
        <div className="mt-1 flex items-center gap-2">
          <Button
            size="sm"
            variant="ghost"
            disabled={update.isPending}
            onClick={() =>
              update.mutate({ spoolId, commentId: c.id, resolved: c.resolvedAt === null })
            }
          >
            {c.resolvedAt ? 'Reopen' : 'Resolve'}
          </Button>
          {update.isError ? (
            <span className="text-xs text-red-700">{update.error.message}</span>
          ) : null}
        </div>
      ) : null}
    </li>
  );
}

function ReplyBox({
  spoolId,
  elementId,
  exists,
}: {
  spoolId: string;
  elementId: string | null;
  exists: boolean;
}) {
  const create = useCreateComment();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  if (!exists)
    return (
      <p className="text-[11px] text-steel-500">
        This element is not in the current revision; the thread cannot take replies.
      </p>
    );
  const send = () => {
    if (text.trim() === '') {
      setError('Reply: write something first');
      return;
    }
    setError(null);
    const sent = text.trim();
    // Clear only if the box still holds what was sent (typing may have gone on meanwhile).
    create.mutate(
      { spoolId, body: sent, elementId: elementId ?? undefined },
      { onSuccess: () => setText((t) => (t.trim() === sent ? '' : t)) },
    );
  };
  return (
    <div className="flex flex-col gap-1">
      <textarea
        aria-label={`Reply on ${elementId ?? 'the spool'}`}
        rows={2}
        maxLength={4000}
        className={cn(inputClass, 'h-auto py-1 text-sm')}
        placeholder="Reply…"
        value={text}
        onChange={(e) => setText(e.target.value)}
      />
      <div className="flex items-center gap-2">
        <Button size="sm" disabled={create.isPending} onClick={send}>
          Reply
        </Button>
        {error ? (
          <span role="alert" className="text-xs text-red-700">
            {error}
          </span>
        ) : null}
        {create.isError ? (
          <span role="alert" className="text-xs text-red-700">
            {create.error.message}
          </span>
        ) : null}
      </div>
    </div>
  );
}

/** Review comments beside the inspector: new comment (spool or pinned), threads, reply, resolve, reopen, filter. */
export function ReviewPanel({
  spoolId,
  revision,
  elementIds,
  selectedId,
  onSelectElement,
  canComment,
}: ReviewPanelProps) {
  const comments = useComments(spoolId);
  const create = useCreateComment();
  const [filter, setFilter] = useState<CommentFilter>('open');
  const [body, setBody] = useState('');
  const [pin, setPin] = useState<string>(selectedId ?? '');
  const [error, setError] = useState<string | null>(null);
  const listRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    setPin(selectedId ?? '');
  }, [selectedId]);
  useEffect(() => {
    if (!selectedId) return;
    const threads = listRef.current?.querySelectorAll<HTMLElement>('[data-thread]') ?? [];
    const el = Array.from(threads).find((t) => t.dataset.thread === selectedId);
    el?.scrollIntoView?.({ block: 'nearest' });
  }, [selectedId, comments.data]);

  const all = comments.data ?? [];
  const threads = groupThreads(all, filter);
  const openCount = all.filter((c) => c.resolvedAt === null).length;
  const known = new Set(elementIds);

  const submit = () => {
    if (body.trim() === '') {
      setError('Comment: write something first');
      return;
    }
    if (pin !== '' && !known.has(pin)) {
      setError(`Pin to: element ${pin} is not in this revision`);
      return;
    }
    setError(null);
    const sent = body.trim();
    create.mutate(
      { spoolId, body: sent, elementId: pin === '' ? undefined : pin },
      { onSuccess: () => setBody((b) => (b.trim() === sent ? '' : b)) },
    );
  };

  return (
    <div className="flex flex-col gap-3 p-3" data-testid="review-panel">
      <header className="flex items-baseline gap-2">
        <h2 className="text-base font-semibold text-steel-800">Review</h2>
        <span className="text-xs text-steel-500" data-testid="open-count">
          {openCount} open · {all.length - openCount} resolved
        </span>
      </header>
      {canComment ? (
        <form
          aria-label="New comment"
          className="flex flex-col gap-1.5 rounded border border-steel-200 p-2"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            submit();
          }}
        >
          <label className="text-xs font-medium text-steel-600" htmlFor="new-comment-body">
            New comment on revision {revision}
          </label>
          <textarea
            id="new-comment-body"
            rows={3}
            maxLength={4000}
            className={cn(inputClass, 'h-auto py-1 text-sm')}
            value={body}
            onChange={(e) => setBody(e.target.value)}
            placeholder="What should change, and why"
          />
          <div className="flex items-center gap-2">
            <label className="text-xs text-steel-600" htmlFor="new-comment-pin">
              Pin to
            </label>
            <select
              id="new-comment-pin"
              className={cn(inputClass, 'h-7 w-40 text-xs')}
              value={pin}
              onChange={(e) => setPin(e.target.value)}
            >
              <option value="">the whole spool</option>
              {elementIds.map((id) => (
                <option key={id} value={id}>
                  element {id}
                </option>
              ))}
            </select>
            <Button
              type="submit"
              size="sm"
              variant="primary"
              className="ml-auto"
              disabled={create.isPending}
            >
              {create.isPending ? 'Adding…' : 'Add comment'}
            </Button>
          </div>
          {error ? (
            <p role="alert" className="text-xs text-red-700">
              {error}
            </p>
          ) : null}
          {create.isError ? <ErrorLine error={create.error} /> : null}
        </form>
      ) : null}
      <div role="radiogroup" aria-label="Show comments" className="flex gap-1 text-xs">
        {(['open', 'resolved', 'all'] as const).map((f) => (
          <button
            key={f}
            type="button"
            role="radio"
            aria-checked={filter === f}
            onClick={() => setFilter(f)}
            className={cn(
              'rounded border px-2 py-0.5',
              filter === f
                ? 'border-copper-500 bg-copper-400/15 font-semibold text-steel-900'
                : 'border-steel-200 text-steel-600 hover:bg-steel-50',
            )}
          >
            {f}
          </button>
        ))}
      </div>
      {comments.isPending ? <LoadingLine label="Loading comments…" /> : null}
      {comments.isError ? <ErrorLine error={comments.error} /> : null}
      <div ref={listRef} className="flex flex-col gap-3">
        {comments.isSuccess && threads.length === 0 ? (
          <p className="text-sm text-steel-500">
            No {filter === 'all' ? '' : `${filter} `}comments.
          </p>
        ) : null}
        {threads.map((t) => {
          const focused = t.elementId !== null && t.elementId === selectedId;
          return (
            <section
              key={t.elementId ?? '(spool)'}
              data-thread={t.elementId ?? '(spool)'}
              aria-label={t.elementId ? `Thread on ${t.elementId}` : 'Thread on the whole spool'}
              className={cn(
                'flex flex-col gap-1.5 rounded-lg border p-2',
                focused ? 'border-violet-500 ring-2 ring-violet-200' : 'border-steel-200',
              )}
            >
              <div className="flex items-center gap-2">
                {t.elementId ? (
                  <button
                    type="button"
                    className="text-sm font-semibold text-copper-600 hover:underline"
                    onClick={() => onSelectElement(t.elementId!)}
                    disabled={!known.has(t.elementId)}
                    title={
                      known.has(t.elementId)
                        ? `Select ${t.elementId}`
                        : 'not in the current revision'
                    }
                  >
                    Element {t.elementId}
                  </button>
                ) : (
                  <span className="text-sm font-semibold text-steel-700">Whole spool</span>
                )}
                <span className="text-xs text-steel-500">{t.open} open</span>
              </div>
              <ul className="flex flex-col gap-1.5">
                {t.comments.map((c) => (
                  <CommentItem
                    key={c.id}
                    c={c}
                    revision={revision}
                    spoolId={spoolId}
                    canComment={canComment}
                  />
                ))}
              </ul>
              {canComment ? (
                <ReplyBox
                  spoolId={spoolId}
                  elementId={t.elementId}
                  exists={t.elementId === null || known.has(t.elementId)}
                />
              ) : null}
            </section>
          );
        })}
      </div>
    </div>
  );
}
