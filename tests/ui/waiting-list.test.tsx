// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import { createQueryClient } from '@/lib/query-client';
import { WaitingCount, WaitingList, WaitingRows } from '@/features/review/components/waiting-list';
import type { Waiting } from '@/features/review/api/review-schemas';

const summary = (id: string, name: string, status: Waiting['state']) => ({
  id,
  name,
  line: `L-${id}`,
  status,
  revision: 1,
  version: 4,
  worst: { elementId: 'B1', status: 'fail' as const },
  summary: { pass: 1, marginal: 0, fail: 1, review: 0, invalid: 0 },
  updatedAt: '2026-01-02T10:00:00.000Z',
});

const designerQueue: Waiting = {
  role: 'designer',
  state: 'draft',
  total: 1,
  items: [
    {
      spool: summary('s1', 'Returned spool', 'draft'),
      openComments: 2,
      comments: [
        {
          id: 7,
          revision: 1,
          elementId: 'B1',
          body: 'Wall short',
          createdAt: '2026-01-02T09:00:00.000Z',
        },
        {
          id: 8,
          revision: 1,
          elementId: null,
          body: 'See B1',
          createdAt: '2026-01-02T09:01:00.000Z',
        },
      ],
      since: '2026-01-02T09:02:00.000Z',
      note: 'See B1',
    },
  ],
};

const wrap = (ui: React.ReactNode) => (
  <QueryClientProvider client={createQueryClient()}>
    <MemoryRouter>{ui}</MemoryRouter>
  </QueryClientProvider>
);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('waiting rows', () => {
  it('lists a designer’s returned spools with their open comments, each linking into the spool', () => {
    render(wrap(<WaitingRows waiting={designerQueue} />));
    const row = screen
      .getByTestId('waiting-list')
      .querySelector('[data-waiting-spool="s1"]') as HTMLElement;
    expect(within(row).getByRole('link', { name: 'Returned spool' }).getAttribute('href')).toBe(
      '/spools/s1?panel=review',
    );
    expect(within(row).getByTestId('waiting-open-comments').textContent).toBe('2 open comments');
    expect(within(row).getByRole('link', { name: 'B1' }).getAttribute('href')).toBe(
      '/spools/s1?element=B1&panel=review',
    );
    expect(within(row).getByText('Wall short')).toBeTruthy();
    // the return note is also a comment: shown once
    expect(within(row).getAllByText(/See B1/)).toHaveLength(1);
  });

  it('says so when nothing waits, in the role’s words', () => {
    render(
      wrap(
        <WaitingRows waiting={{ role: 'fabricator', state: 'released', total: 0, items: [] }} />,
      ),
    );
    expect(screen.getByText('No spool has been released yet.')).toBeTruthy();
  });
});

describe('waiting list and header count', () => {
  beforeEach(() => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: string) => {
        const url = new URL(input, 'http://test.local');
        if (url.pathname === '/api/waiting') {
          return new Response(
            JSON.stringify({
              role: 'checker',
              state: 'submitted',
              total: 2,
              items: [summary('a', 'Alpha', 'submitted'), summary('b', 'Bravo', 'submitted')].map(
                (spool) => ({ spool, openComments: 0, since: null, note: null }),
              ),
            }),
            { status: 200 },
          );
        }
        return new Response(JSON.stringify({ error: { code: 'not_found', message: 'no route' } }), {
          status: 404,
        });
      }),
    );
  });

  it('shows the checker’s queue and the count', async () => {
    render(
      wrap(
        <>
          <WaitingCount />
          <WaitingList />
        </>,
      ),
    );
    expect(await screen.findByText('Submitted for check')).toBeTruthy();
    expect(screen.getByTestId('waiting-total').textContent).toBe('2');
    expect(screen.getByTestId('waiting-count').textContent).toBe('Waiting on me2');
    expect(screen.getByTestId('waiting-count').getAttribute('href')).toBe('/spools#waiting');
    expect(
      screen.getAllByRole('link', { name: /Alpha|Bravo/ }).map((a) => a.getAttribute('href')),
    ).toEqual(['/spools/a?panel=review', '/spools/b?panel=review']);
  });
});
