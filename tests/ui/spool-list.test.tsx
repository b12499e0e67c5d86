// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import { createQueryClient } from '@/lib/query-client';
import { SpoolListPage } from '@/features/spools/components/spool-list-page';

const summary = (id: string, name: string, status: string) => ({
  id,
  name,
  line: `L-${id}`,
  status,
  revision: 0,
  version: 1,
  worst: { elementId: 'B1', status: 'fail' },
  summary: { pass: 1, marginal: 0, fail: 1, review: 0, invalid: 0 },
  updatedAt: '2026-01-02T10:00:00.000Z',
});

let role = 'designer';
const listCalls: URLSearchParams[] = [];

beforeEach(() => {
  listCalls.length = 0;
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string) => {
      const url = new URL(input, 'http://test.local');
      if (url.pathname === '/api/me') {
        return new Response(
          JSON.stringify({
            user: { id: 'u1', email: 'a@b.test', name: 'A' },
            team: { id: 't', name: 'T' },
            role,
            permissions: [],
          }),
          { status: 200 },
        );
      }
      if (url.pathname === '/api/spools') {
        listCalls.push(url.searchParams);
        const items = [
          summary('s1', 'Alpha spool', 'draft'),
          summary('s2', 'Bravo spool', 'checked'),
        ];
        return new Response(
          JSON.stringify({
            items,
            total: 60,
            page: Number(url.searchParams.get('page') ?? 1),
            pageSize: 25,
          }),
          { status: 200 },
        );
      }
      return new Response(JSON.stringify({ error: { code: 'not-found', message: 'no route' } }), {
        status: 404,
      });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderList() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={['/spools']}>
        <SpoolListPage />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const last = () => listCalls[listCalls.length - 1]!;

describe('spool register', () => {
  it('lists spools and sends search, state filter, sort and page to the server', async () => {
    const user = userEvent.setup();
    renderList();
    expect(await screen.findByText('Alpha spool')).toBeTruthy();
    expect(screen.getByText('60 spools')).toBeTruthy();
    expect(last().get('sort')).toBe('-updatedAt');

    await user.type(screen.getByLabelText('Find spools'), 'bra');
    await waitFor(() => expect(last().get('search')).toBe('bra'));

    await user.selectOptions(screen.getByLabelText('Filter by state'), 'checked');
    await waitFor(() => expect(last().get('status')).toBe('checked'));

    await user.click(screen.getByRole('button', { name: /^Spool/ }));
    await waitFor(() => expect(last().get('sort')).toBe('name'));
    await user.click(screen.getByRole('button', { name: /^Spool/ }));
    await waitFor(() => expect(last().get('sort')).toBe('-name'));

    await user.click(screen.getByRole('button', { name: /Next/ }));
    await waitFor(() => expect(last().get('page')).toBe('2'));
    expect(screen.getByText('page 2 of 3')).toBeTruthy();
    expect(await screen.findByRole('button', { name: '+ New spool' })).toBeTruthy();
  });

  it('hides "New spool" from a role that may not edit', async () => {
    role = 'fabricator';
    renderList();
    expect(await screen.findByText('Alpha spool')).toBeTruthy();
    await waitFor(() => expect(fetch).toHaveBeenCalledWith('/api/me', expect.anything()));
    expect(screen.queryByRole('button', { name: '+ New spool' })).toBeNull();
    role = 'designer';
  });
});
