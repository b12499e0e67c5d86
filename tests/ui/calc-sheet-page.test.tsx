// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { CAUTION } from '@shared/model/caution';
import { createQueryClient } from '@/lib/query-client';
import { CalcSheetPage } from '@/features/calc-sheet/components/calc-sheet-page';

const doc = (name: string, pressure: number) => ({
  units: 'imperial',
  name,
  line: 'L-9',
  conditions: { pressure, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
  elements: [
    { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 48 },
    { id: 'B1', kind: 'bend', nps: '4', schedule: '40', bendRadius: { multipleOfD: 3 }, angle: 90 },
  ],
});
const revisions = {
  0: {
    spoolId: 's1',
    revision: 0,
    status: 'released',
    name: 'Sheet spool',
    line: 'L-9',
    current: false,
    document: doc('Sheet spool', 285),
  },
  1: {
    spoolId: 's1',
    revision: 1,
    status: 'draft',
    name: 'Sheet spool',
    line: 'L-9',
    current: true,
    document: doc('Sheet spool', 3000),
  },
} as const;
const events = [
  {
    id: 1,
    revision: 0,
    from: 'draft',
    to: 'submitted',
    note: 'ready',
    user: { id: 'u1', name: 'Dana Designer' },
    createdAt: '2026-01-02T10:00:00.000Z',
  },
  {
    id: 2,
    revision: 0,
    from: 'submitted',
    to: 'checked',
    note: null,
    user: { id: 'u2', name: 'Cary Checker' },
    createdAt: '2026-01-02T11:00:00.000Z',
  },
  {
    id: 3,
    revision: 0,
    from: 'checked',
    to: 'released',
    note: null,
    user: { id: 'u3', name: 'Lee Lead' },
    createdAt: '2026-01-02T12:00:00.000Z',
  },
  {
    id: 4,
    revision: 1,
    from: 'released',
    to: 'draft',
    note: 'Edited: revision 1 opened',
    user: { id: 'u1', name: 'Dana Designer' },
    createdAt: '2026-01-03T09:00:00.000Z',
  },
];

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status });

beforeEach(() => {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string) => {
      const url = new URL(input, 'http://test.local');
      const p = url.pathname;
      if (p === '/api/me')
        return json({
          user: { id: 'u2', email: 'c@b.test', name: 'Cary Checker' },
          team: { id: 't', name: 'Team Ferrule' },
          role: 'checker',
          permissions: [],
        });
      if (p === '/api/materials') return json({ items: [] });
      if (p === '/api/spools/s1/revisions')
        return json({ items: Object.values(revisions).map(({ document: _d, ...r }) => r) });
      const m = /^\/api\/spools\/s1\/revisions\/(\d+)$/.exec(p);
      if (m) {
        const r = revisions[Number(m[1]) as 0 | 1];
        return r
          ? json(r)
          : json({ error: { code: 'not_found', message: 'Revision not found' } }, 404);
      }
      if (p === '/api/spools/s1/events') return json({ items: events });
      return json({ error: { code: 'not_found', message: `no route ${p}` } }, 404);
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPage(path: string) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/spools/:spoolId/calc-sheet" element={<CalcSheetPage />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('calc sheet page', () => {
  it('shows the current revision with its team, elements, trail and caution, and links its PDF', async () => {
    renderPage('/spools/s1/calc-sheet');
    const sheet = await screen.findByTestId('calc-sheet');
    expect(sheet.textContent).toContain('Sheet spool · rev. 1 · draft');
    expect(
      within(screen.getByTestId('calc-sheet-identity')).getByText('Team Ferrule'),
    ).toBeTruthy();
    const ids = screen
      .getAllByTestId('calc-sheet-element')
      .map((e) => e.getAttribute('data-element-id'));
    expect(ids).toEqual(['S1', 'B1']);
    // 3000 psi on NPS 4 Sch 40 A106-B fails (B31.3 Eq. 3a: t = 3000 × 4.5 / (2 × (20000 + 3000 × 0.4)) = 0.3184 in > 0.237 in).
    expect(
      within(screen.getByTestId('calc-sheet-overview')).getAllByText('fail').length,
    ).toBeGreaterThan(0);
    expect(screen.getAllByTestId('calc-sheet-trail-step').length).toBeGreaterThanOrEqual(3 + 4 * 3);
    expect(screen.getAllByTestId('caution')[0]!.textContent).toContain(CAUTION);
    expect(screen.getByTestId('calc-sheet-history').textContent).toContain(
      'edited: reopened as a new revision',
    );
    expect(screen.getByTestId('download-pdf').getAttribute('href')).toBe(
      '/api/spools/s1/calc-sheet.pdf?revision=1',
    );
  });

  it('switches to an earlier revision with its own history and PDF', async () => {
    renderPage('/spools/s1/calc-sheet');
    await screen.findByTestId('calc-sheet');
    await userEvent.selectOptions(screen.getByLabelText('Revision'), '0');
    expect((await screen.findByText(/Sheet spool · rev\. 0 · released/)).tagName).toBe('P');
    const history = screen.getByTestId('calc-sheet-history').textContent ?? '';
    expect(history).toContain('released for fabrication');
    expect(history).toContain('Lee Lead');
    expect(history).not.toContain('reopened');
    expect(screen.getByTestId('download-pdf').getAttribute('href')).toBe(
      '/api/spools/s1/calc-sheet.pdf?revision=0',
    );
  });

  it('says so when the asked revision does not exist, and offers no PDF', async () => {
    renderPage('/spools/s1/calc-sheet?revision=9');
    expect((await screen.findByRole('alert')).textContent).toContain(
      'Revision 9 of this spool does not exist',
    );
    expect(screen.queryByTestId('download-pdf')).toBeNull();
  });
});
