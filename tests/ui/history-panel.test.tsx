// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import type { SpoolDocument } from '@shared/model/spool';
import { createQueryClient } from '@/lib/query-client';
import { HistoryPanel } from '@/features/review/components/history-panel';

const rev0: SpoolDocument = {
  units: 'imperial',
  name: 'H',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
  elements: [
    { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 30, direction: 'east' },
    {
      kind: 'bend',
      id: 'B1',
      nps: '2',
      schedule: '40',
      bendRadius: { multipleOfD: 3 },
      angle: 90,
      direction: 'north',
    },
  ],
};
// revision 1: B1 heavier, S2 added, pressure raised so S1 fails (2" Sch 40 at 1500 psi, B31.3 Eq. 3a)
const rev1: SpoolDocument = {
  ...rev0,
  conditions: { ...rev0.conditions, pressure: 1500 },
  elements: [
    rev0.elements[0]!,
    { ...rev0.elements[1]!, schedule: '160' } as SpoolDocument['elements'][number],
    { kind: 'straight', id: 'S2', nps: '2', schedule: '160', length: 12, direction: 'north' },
  ],
};

beforeEach(() => {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string) => {
      const url = new URL(input, 'http://test.local');
      const json = (b: unknown) => new Response(JSON.stringify(b), { status: 200 });
      const info = (r: number) => ({
        revision: r,
        status: r === 0 ? 'released' : 'draft',
        name: 'H',
        line: '',
        version: 2 + r,
        current: r === 1,
        frozenAt: r === 0 ? '2026-01-02T10:00:00.000Z' : null,
        frozenBy: r === 0 ? { id: 'l', name: 'Lee Lead' } : null,
        summary: { pass: 2, marginal: 0, fail: 0, review: 0, invalid: 0 },
        worst: null,
      });
      if (url.pathname === '/api/spools/sp1/revisions') return json({ items: [info(0), info(1)] });
      const m = /^\/api\/spools\/sp1\/revisions\/(\d+)$/.exec(url.pathname);
      if (m) {
        const r = Number(m[1]);
        return json({
          spoolId: 'sp1',
          ...info(r),
          document: r === 0 ? rev0 : rev1,
          updatedAt: '2026-01-02T10:00:00.000Z',
        });
      }
      if (url.pathname === '/api/spools/sp1/events') {
        return json({
          items: [
            {
              id: 1,
              revision: 0,
              from: 'draft',
              to: 'submitted',
              note: null,
              user: { id: 'd', name: 'Dana Designer' },
              createdAt: '2026-01-01T10:00:00.000Z',
            },
            {
              id: 2,
              revision: 0,
              from: 'submitted',
              to: 'draft',
              note: 'Fix B1',
              user: { id: 'c', name: 'Chris Checker' },
              createdAt: '2026-01-01T11:00:00.000Z',
            },
          ],
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

describe('history panel', () => {
  it('lists events and revisions, links each revision read-only and compares the last two', async () => {
    render(
      <QueryClientProvider client={createQueryClient()}>
        <MemoryRouter>
          <HistoryPanel spoolId="sp1" />
        </MemoryRouter>
      </QueryClientProvider>,
    );
    const events = await screen.findAllByTestId('event');
    expect(events.map((e) => within(e).getByTestId('event-move').textContent)).toEqual([
      'submitted → draft',
      'draft → submitted',
    ]);
    expect(events[0]!.textContent).toContain('Chris Checker');
    expect(events[0]!.textContent).toContain('“Fix B1”');
    const revs = screen.getByRole('region', { name: 'Revisions' });
    await waitFor(() =>
      expect(within(revs).getAllByRole('link', { name: 'Open read-only' })).toHaveLength(2),
    );
    expect(
      within(revs).getAllByRole('link', { name: 'Open read-only' })[0]!.getAttribute('href'),
    ).toBe('/spools/sp1/revisions/0');
    expect(revs.textContent).toContain('by Lee Lead');
    const diff = await screen.findByTestId('revision-diff');
    expect(within(diff).getByRole('region', { name: 'Added elements' }).textContent).toContain(
      'S2 (straight)',
    );
    expect(diff.querySelector('[data-change="B1.schedule"]')?.textContent).toContain('40 → 160');
    expect(diff.querySelector('[data-change="conditions.pressure"]')?.textContent).toContain(
      '150 → 1500',
    );
    expect(diff.querySelector('[data-status-change="S1"]')?.textContent).toContain('pass');
    expect(diff.querySelector('[data-status-change="S1"]')?.textContent).toContain('fail');
  });
});
