// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { createQueryClient } from '@/lib/query-client';
import {
  countOpenByElement,
  groupThreads,
  ReviewPanel,
} from '@/features/review/components/review-panel';
import { ReturnForm } from '@/features/review/components/return-form';
import type { ReviewComment } from '@/features/review/api/review-schemas';

const comment = (
  id: number,
  elementId: string | null,
  body: string,
  o: Partial<ReviewComment> = {},
): ReviewComment => ({
  id,
  revision: 1,
  elementId,
  body,
  user: { id: 'u1', name: 'Chris Checker' },
  createdAt: '2026-01-02T10:00:00.000Z',
  resolvedAt: null,
  resolvedBy: null,
  ...o,
});

let store: ReviewComment[] = [];
const calls: { method: string; path: string; body: unknown }[] = [];

beforeEach(() => {
  calls.length = 0;
  store = [
    comment(1, 'B1', 'Radius too tight', { revision: 0 }),
    comment(2, null, 'Check the line number'),
    comment(3, 'B1', 'Wall short at the intrados'),
    comment(4, 'S2', 'Old remark', {
      resolvedAt: '2026-01-03T10:00:00.000Z',
      resolvedBy: { id: 'u2', name: 'Dana Designer' },
    }),
  ];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string, init?: RequestInit) => {
      const url = new URL(input, 'http://test.local');
      const method = init?.method ?? 'GET';
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      calls.push({ method, path: url.pathname, body });
      if (url.pathname === '/api/spools/sp1/comments' && method === 'GET')
        return new Response(JSON.stringify({ items: store }), { status: 200 });
      if (url.pathname === '/api/spools/sp1/comments' && method === 'POST') {
        const c = comment(store.length + 1, body.elementId ?? null, body.body);
        store = [...store, c];
        return new Response(JSON.stringify(c), { status: 201 });
      }
      const m = /^\/api\/spools\/sp1\/comments\/(\d+)$/.exec(url.pathname);
      if (m && method === 'PATCH') {
        store = store.map((c) =>
          c.id === Number(m[1])
            ? {
                ...c,
                resolvedAt: body.resolved ? '2026-01-04T10:00:00.000Z' : null,
                resolvedBy: body.resolved ? { id: 'u2', name: 'Dana Designer' } : null,
              }
            : c,
        );
        return new Response(JSON.stringify(store.find((c) => c.id === Number(m[1]))), {
          status: 200,
        });
      }
      return new Response(JSON.stringify({ error: { code: 'not_found', message: 'no route' } }), {
        status: 404,
      });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPanel(props: Partial<Parameters<typeof ReviewPanel>[0]> = {}) {
  const onSelectElement = vi.fn();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ReviewPanel
        spoolId="sp1"
        revision={1}
        elementIds={['S1', 'B1', 'S2']}
        selectedId={null}
        onSelectElement={onSelectElement}
        canComment
        {...props}
      />
    </QueryClientProvider>,
  );
  return { onSelectElement };
}

describe('comment threads', () => {
  it('groups by element, keeps the filter and counts open comments', () => {
    const open = groupThreads(store, 'open');
    expect(open.map((t) => [t.elementId, t.comments.map((c) => c.id), t.open])).toEqual([
      ['B1', [1, 3], 2],
      [null, [2], 1],
    ]);
    expect(groupThreads(store, 'resolved').map((t) => t.elementId)).toEqual(['S2']);
    expect(groupThreads(store, 'all')).toHaveLength(3);
    expect([...countOpenByElement(store)]).toEqual([['B1', 2]]);
  });
});

describe('review panel', () => {
  it('shows author, time and revision, marks earlier revisions and filters', async () => {
    const user = userEvent.setup();
    renderPanel();
    const thread = await screen.findByRole('region', { name: 'Thread on B1' });
    const items = within(thread).getAllByTestId('comment');
    expect(items).toHaveLength(2);
    expect(within(items[0]!).getByTestId('comment-revision').textContent).toBe('rev. 0 (earlier)');
    expect(within(items[1]!).getByTestId('comment-revision').textContent).toBe('rev. 1');
    expect(items[0]!.textContent).toContain('Chris Checker');
    expect(screen.getByTestId('open-count').textContent).toBe('3 open · 1 resolved');
    expect(screen.queryByText('Old remark')).toBeNull();
    await user.click(screen.getByRole('radio', { name: 'resolved' }));
    expect(await screen.findByText('Old remark')).toBeTruthy();
    expect(screen.getByText(/resolved by Dana Designer/)).toBeTruthy();
    expect(screen.queryByText('Radius too tight')).toBeNull();
  });

  it('adds a comment pinned to the selected element and refuses an empty one', async () => {
    const user = userEvent.setup();
    renderPanel({ selectedId: 'S1' });
    await screen.findByRole('region', { name: 'Thread on B1' });
    expect((screen.getByLabelText('Pin to') as HTMLSelectElement).value).toBe('S1');
    await user.click(screen.getByRole('button', { name: 'Add comment' }));
    expect(screen.getByRole('alert').textContent).toContain('Comment: write something first');
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
    await user.type(screen.getByLabelText(/New comment on revision 1/), 'Cut length?');
    await user.click(screen.getByRole('button', { name: 'Add comment' }));
    await screen.findByRole('region', { name: 'Thread on S1' });
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      body: 'Cut length?',
      elementId: 'S1',
    });
    await waitFor(() =>
      expect(
        (screen.getByLabelText(/New comment on revision 1/) as HTMLTextAreaElement).value,
      ).toBe(''),
    );
  });

  it('replies in a thread, resolves and reopens', async () => {
    const user = userEvent.setup();
    renderPanel();
    const thread = await screen.findByRole('region', { name: 'Thread on B1' });
    await user.type(within(thread).getByLabelText('Reply on B1'), 'Changed to Sch 80');
    await user.click(within(thread).getByRole('button', { name: 'Reply' }));
    await waitFor(() =>
      expect(
        within(screen.getByRole('region', { name: 'Thread on B1' })).getAllByTestId('comment'),
      ).toHaveLength(3),
    );
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      body: 'Changed to Sch 80',
      elementId: 'B1',
    });

    const first = within(screen.getByRole('region', { name: 'Thread on B1' })).getAllByTestId(
      'comment',
    )[0]!;
    await user.click(within(first).getByRole('button', { name: 'Resolve' }));
    await waitFor(() =>
      expect(screen.getByTestId('open-count').textContent).toBe('3 open · 2 resolved'),
    );
    expect(calls.find((c) => c.method === 'PATCH')).toMatchObject({
      path: '/api/spools/sp1/comments/1',
      body: { resolved: true },
    });
    await user.click(screen.getByRole('radio', { name: 'all' }));
    const resolved = screen
      .getAllByTestId('comment')
      .find((c) => c.getAttribute('data-comment-id') === '1')!;
    await user.click(within(resolved).getByRole('button', { name: 'Reopen' }));
    await waitFor(() =>
      expect(screen.getByTestId('open-count').textContent).toBe('4 open · 1 resolved'),
    );
  });

  it('selects the element of a thread and hides the forms without the comment permission', async () => {
    const user = userEvent.setup();
    const { onSelectElement } = renderPanel({ canComment: false });
    await screen.findByRole('region', { name: 'Thread on B1' });
    expect(screen.queryByRole('form', { name: 'New comment' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Resolve' })).toBeNull();
    await user.click(screen.getByRole('button', { name: 'Element B1' }));
    expect(onSelectElement).toHaveBeenCalledWith('B1');
  });
});

describe('return form', () => {
  it('asks for the note in the page and refuses an empty one', async () => {
    const user = userEvent.setup();
    const onReturn = vi.fn();
    const onCancel = vi.fn();
    render(<ReturnForm onReturn={onReturn} onCancel={onCancel} />);
    const form = screen.getByRole('dialog', { name: 'Return to designer' });
    await user.click(within(form).getByRole('button', { name: 'Return with this note' }));
    expect(within(form).getByRole('alert').textContent).toContain('Note:');
    expect(onReturn).not.toHaveBeenCalled();
    await user.type(within(form).getByLabelText(/Why is it returned/), '  B1 radius  ');
    await user.click(within(form).getByRole('button', { name: 'Return with this note' }));
    expect(onReturn).toHaveBeenCalledWith('B1 radius');
    await user.click(within(form).getByRole('button', { name: 'Cancel' }));
    expect(onCancel).toHaveBeenCalled();
  });
});
