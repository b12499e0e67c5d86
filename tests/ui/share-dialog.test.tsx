// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { checkSpool } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { createQueryClient } from '@/lib/query-client';
import { readExpiryDays, ShareDialog } from '@/features/share/components/share-dialog';
import { PublicSharePage } from '@/features/share/components/public-share-page';
import { shareState } from '@/features/share/api/share-schemas';

// The 3D canvas needs WebGL, which jsdom lacks: the slot's error boundary keeps the rest usable.
vi.mock('@/features/sketch/canvas/sketch-canvas-lazy', () => ({
  SketchCanvasLazy: () => <div data-testid="canvas-stub" />,
}));

const NOW = Date.now();
const iso = (dDays: number) => new Date(NOW + dDays * 86_400_000).toISOString();
const share = (id: string, o: Record<string, unknown> = {}) => ({
  id,
  spoolId: 'sp1',
  revision: 0,
  status: 'released',
  name: 'Spool A',
  createdAt: iso(-1),
  expiresAt: iso(6),
  revokedAt: null as string | null,
  active: true,
  createdBy: { id: 'u1', name: 'Lee Lead' },
  ...o,
});

let shares: ReturnType<typeof share>[] = [];
const calls: { method: string; path: string; body: unknown }[] = [];
const doc: SpoolDocument = {
  units: 'imperial',
  name: 'Shared spool',
  line: '2"-SH-1',
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
    { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 30, direction: 'north' },
  ],
};
let publicAnswer: { status: number; body: unknown } = { status: 200, body: {} };

beforeEach(() => {
  calls.length = 0;
  shares = [
    share('old-expired', { expiresAt: iso(-1), active: false }),
    share('old-revoked', { revokedAt: iso(-0.5), active: false }),
    share('live'),
  ];
  publicAnswer = {
    status: 200,
    body: {
      spool: {
        name: 'Shared spool',
        line: '2"-SH-1',
        revision: 2,
        status: 'released',
        document: doc,
      },
      check: checkSpool(doc),
      sharedAt: iso(-1),
      expiresAt: iso(6),
      sharedBy: 'Lee Lead',
    },
  };
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string, init?: RequestInit) => {
      const url = new URL(input, 'http://test.local');
      const method = init?.method ?? 'GET';
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      calls.push({ method, path: url.pathname, body });
      const json = (b: unknown, status = 200) =>
        new Response(b === undefined ? null : JSON.stringify(b), { status });
      if (url.pathname === '/api/spools/sp1/revisions') {
        return json({
          items: [0, 1].map((r) => ({
            revision: r,
            status: r === 0 ? 'released' : 'draft',
            name: 'Spool A',
            line: '',
            version: 3,
            current: r === 1,
            frozenAt: null,
            frozenBy: null,
            summary: { pass: 3, marginal: 0, fail: 0, review: 0, invalid: 0 },
            worst: null,
          })),
        });
      }
      if (url.pathname === '/api/spools/sp1/shares' && method === 'GET')
        return json({ items: shares });
      if (url.pathname === '/api/spools/sp1/shares' && method === 'POST') {
        const s = share('new', {
          revision: body.revision,
          expiresAt: iso(body.expiresInDays),
          createdAt: iso(0),
        });
        shares = [s, ...shares];
        return json({ ...s, url: 'http://app.test/share/secret-token' }, 201);
      }
      const m = /^\/api\/spools\/sp1\/shares\/([\w-]+)$/.exec(url.pathname);
      if (m && method === 'DELETE') {
        shares = shares.map((s) =>
          s.id === m[1] ? { ...s, revokedAt: iso(0), active: false } : s,
        );
        return json(undefined, 204);
      }
      if (url.pathname.startsWith('/api/share/'))
        return json(publicAnswer.body, publicAnswer.status);
      return json({ error: { code: 'not_found', message: 'no route' } }, 404);
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('share state and expiry field', () => {
  it('reads active, expired and revoked', () => {
    expect(shareState({ revokedAt: null, expiresAt: iso(1) }, NOW)).toBe('active');
    expect(shareState({ revokedAt: null, expiresAt: iso(-1) }, NOW)).toBe('expired');
    expect(shareState({ revokedAt: iso(-2), expiresAt: iso(1) }, NOW)).toBe('revoked');
  });
  it('takes whole days from 1 to 365 and names the field otherwise', () => {
    expect(readExpiryDays(' 7 ')).toEqual({ ok: true, days: 7 });
    for (const bad of ['0', '366', '1.5', '', 'abc', '-3']) {
      const r = readExpiryDays(bad);
      expect(r.ok, bad).toBe(false);
      if (!r.ok) expect(r.message).toMatch(/^Expires in \(days\)/);
    }
  });
});

function renderDialog() {
  const onClose = vi.fn();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ShareDialog spoolId="sp1" spoolName="Spool A" currentRevision={1} onClose={onClose} />
    </QueryClientProvider>,
  );
  return { onClose };
}

describe('share dialog', () => {
  it('lists every link with its state, maker and expiry, without tokens', async () => {
    renderDialog();
    const list = await screen.findByTestId('share-list');
    await waitFor(() => expect(list.querySelectorAll('tbody tr')).toHaveLength(3));
    expect(
      [...list.querySelectorAll('tbody tr')].map((tr) => tr.getAttribute('data-state')),
    ).toEqual(['expired', 'revoked', 'active']);
    expect(list.textContent).toContain('Lee Lead');
    expect(within(list).getAllByRole('button', { name: 'Revoke' })).toHaveLength(1);
    expect(screen.queryByLabelText('Share link', { exact: true })).toBeNull();
  });

  it('refuses a bad expiry, creates a link for the chosen revision and shows it once', async () => {
    const user = userEvent.setup();
    renderDialog();
    await screen.findByTestId('share-list');
    await waitFor(() => expect(screen.getByRole('option', { name: /rev\. 0/ })).toBeTruthy());
    expect((screen.getByLabelText('Revision') as HTMLSelectElement).value).toBe('1');
    const days = screen.getByLabelText('Expires in (days)');
    await user.clear(days);
    await user.type(days, '400');
    await user.click(screen.getByRole('button', { name: 'Create link' }));
    expect(screen.getByRole('alert').textContent).toContain('between 1 and 365');
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
    await user.clear(days);
    await user.type(days, '14');
    await user.selectOptions(screen.getByLabelText('Revision'), '0');
    await user.click(screen.getByRole('button', { name: 'Create link' }));
    const link = (await screen.findByLabelText('Share link', { exact: true })) as HTMLInputElement;
    expect(link.value).toBe('http://app.test/share/secret-token');
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      revision: 0,
      expiresInDays: 14,
    });
    expect(screen.getByTestId('new-share').textContent).toContain('shown only now');
    await waitFor(() =>
      expect(screen.getByTestId('share-list').querySelectorAll('tbody tr')).toHaveLength(4),
    );
    // copy: the clipboard gets the link
    const writeText = vi.fn(async () => undefined);
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    await user.click(screen.getByRole('button', { name: 'Copy link' }));
    expect(writeText).toHaveBeenCalledWith('http://app.test/share/secret-token');
    expect(await screen.findByText('Copied to the clipboard.')).toBeTruthy();
  });

  it('revokes a link', async () => {
    const user = userEvent.setup();
    renderDialog();
    const list = await screen.findByTestId('share-list');
    await user.click(await within(list).findByRole('button', { name: 'Revoke' }));
    await waitFor(() =>
      expect(list.querySelector('tr[data-share-id="live"]')?.getAttribute('data-state')).toBe(
        'revoked',
      ),
    );
    expect(calls.find((c) => c.method === 'DELETE')?.path).toBe('/api/spools/sp1/shares/live');
  });
});

function renderPublic() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={['/share/tok123']}>
        <Routes>
          <Route path="/share/:token" element={<PublicSharePage />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('public share page', () => {
  it('shows the shared revision read-only with the element list, inspector and caution', async () => {
    const user = userEvent.setup();
    renderPublic();
    const banner = await screen.findByTestId('share-banner');
    for (const want of [
      'Shared spool',
      'line 2"-SH-1',
      'revision 2',
      'Released',
      'Shared by Lee Lead',
    ])
      expect(banner.textContent).toContain(want);
    expect(
      screen.getByRole('link', { name: 'Download calc sheet (PDF)' }).getAttribute('href'),
    ).toBe('/api/share/tok123/calc-sheet.pdf');
    await user.click(screen.getByText('B1', { selector: 'code' }));
    const inspector = await screen.findByTestId('inspector');
    expect(inspector.getAttribute('data-element-id')).toBe('B1');
    expect(within(inspector).getAllByTestId('trail-step').length).toBeGreaterThan(0);
    expect(screen.getAllByTestId('caution').length).toBeGreaterThan(0);
    expect(
      screen.queryByRole('button', { name: /^(Save|Apply|Use schedule|Draw leg)/ }),
    ).toBeNull();
    expect((within(inspector).getByLabelText('Schedule') as HTMLSelectElement).disabled).toBe(true);
    expect(calls.every((c) => c.path.startsWith('/api/share/'))).toBe(true);
  });

  it('says a revoked link is revoked', async () => {
    publicAnswer = {
      status: 410,
      body: { error: { code: 'gone', message: 'This share link was revoked' } },
    };
    renderPublic();
    expect((await screen.findByTestId('share-revoked')).textContent).toContain(
      'This link was revoked',
    );
    expect(screen.queryByTestId('share-banner')).toBeNull();
  });

  it('says an expired link has expired, and an unknown one does not exist', async () => {
    publicAnswer = {
      status: 410,
      body: { error: { code: 'gone', message: 'This share link has expired' } },
    };
    renderPublic();
    expect((await screen.findByTestId('share-expired')).textContent).toContain('expired');
    cleanup();
    publicAnswer = {
      status: 404,
      body: { error: { code: 'not_found', message: 'Share link not found' } },
    };
    renderPublic();
    expect((await screen.findByTestId('share-unknown')).textContent).toContain('No such link');
  });
});
