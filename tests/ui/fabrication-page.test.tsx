// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import Papa from 'papaparse';
import { createQueryClient } from '@/lib/query-client';
import { FabricationPage } from '@/features/fabrication/components/fabrication-page';
import { SpoolListPage } from '@/features/spools/components/spool-list-page';
import { ConditionsPanel } from '@/features/sketch/components/conditions-panel';
import { drawnStore, renderWithStore } from './helpers';

// NPS 4 Sch 40 A106 B at 500 °F (ST/S = 20.0/18.9, B31.3 Table A-1), 3D bend (R = 12 in), legs 60 and 48 in.
const document = {
  units: 'imperial',
  name: 'Shop =test',
  line: 'L-1',
  conditions: { pressure: 200, temperature: 500, material: 'A106-B' },
  shop: { bendTangent: 4 },
  elements: [
    { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 48, direction: 'east' },
    {
      id: 'B1',
      kind: 'bend',
      nps: '4',
      schedule: '40',
      bendRadius: { multipleOfD: 3 },
      angle: 90,
      direction: 'north',
    },
    { id: '=S2', kind: 'straight', nps: '4', schedule: '40', length: 36 },
  ],
};
const spool = {
  id: 's1',
  name: 'Shop =test',
  line: 'L-1',
  status: 'released',
  revision: 2,
  version: 5,
  worst: null,
  summary: null,
  updatedAt: '2026-01-02T10:00:00.000Z',
  document,
};

let role = 'fabricator';
const downloads: { name: string; blob: Blob }[] = [];

beforeEach(() => {
  downloads.length = 0;
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string) => {
      const url = new URL(input, 'http://test.local');
      if (url.pathname === '/api/me')
        return new Response(
          JSON.stringify({
            user: { id: 'u1', email: 'f@b.test', name: 'F' },
            team: { id: 't', name: 'T' },
            role,
            permissions: [],
          }),
          { status: 200 },
        );
      if (url.pathname === '/api/spools/s1')
        return new Response(JSON.stringify(spool), { status: 200 });
      if (url.pathname === '/api/materials')
        return new Response(JSON.stringify({ items: [] }), { status: 200 });
      if (url.pathname === '/api/spools')
        return new Response(
          JSON.stringify({
            items: [spool, { ...spool, id: 's2', name: 'Draft one', status: 'draft' }],
            total: 2,
            page: 1,
            pageSize: 25,
          }),
          { status: 200 },
        );
      return new Response(JSON.stringify({ error: { code: 'not-found', message: 'no route' } }), {
        status: 404,
      });
    }),
  );
  let blob: Blob | null = null;
  vi.stubGlobal(
    'URL',
    Object.assign(URL, {
      createObjectURL: (b: Blob) => ((blob = b), 'blob:x'),
      revokeObjectURL: () => undefined,
    }),
  );
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
    this: HTMLAnchorElement,
  ) {
    if (blob) downloads.push({ name: this.download, blob });
  });
});
afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
  vi.unstubAllGlobals();
  role = 'fabricator';
});

const renderAt = (path: string) =>
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path="/spools" element={<SpoolListPage />} />
          <Route path="/spools/:spoolId" element={<p>sketcher</p>} />
          <Route path="/spools/:spoolId/fabrication" element={<FabricationPage />} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );

const readBlob = (b: Blob) =>
  new Promise<string>((resolve) => {
    const r = new FileReader();
    r.onload = () => resolve(String(r.result));
    r.readAsText(b);
  });

describe('fabrication sheet page', () => {
  it('shows the bend list, cut list, bill of materials, masses and hydrotest with the cautions', async () => {
    renderAt('/spools/s1/fabrication');
    expect(
      await screen.findByRole('heading', { name: /Fabrication sheet · Shop =test/ }),
    ).toBeTruthy();
    const bends = screen.getByRole('table', { name: 'Bend list' });
    expect(within(bends).getByText('B1')).toBeTruthy();
    expect(within(bends).getByText('1.25')).toBeTruthy(); // B31.1 Table 102.4.5 at 3D
    // Cut lengths: straights as drawn; the bend pipe = R·θ + 2 × 4 in bending tangent = 6π + 8.
    expect(screen.getByTestId('cut-S1').textContent).toBe('48');
    expect(screen.getByTestId('cut-B1').textContent).toBe('26.85');
    expect(screen.getByTestId('weld-count').textContent).toBe('2');
    // Leg of S1 as the sketch labels it: 48 + 12 (tangent of B1).
    const cut = screen.getByRole('table', { name: 'Cut list' });
    expect(within(cut).getAllByText('60').length).toBeGreaterThan(0);
    expect(screen.getByRole('table', { name: 'Bill of materials' })).toBeTruthy();
    // 1.5 × 200 × 20.0/18.9 = 317.5 psi (B31.3 para. 345.4.2)
    expect(screen.getByTestId('test-pressure').textContent).toBe('317.5 psi');
    expect(screen.getByTestId('hydrotest-caution').textContent).toMatch(/owner/);
    expect(screen.getAllByTestId('caution').length).toBeGreaterThan(0);
    expect(screen.getByTestId('sheet-revision').textContent).toBe('rev. 2');
  });

  it('downloads the three CSVs named after spool and revision, units in the header, formula cells neutralised', async () => {
    const user = userEvent.setup();
    renderAt('/spools/s1/fabrication');
    await screen.findByRole('table', { name: 'Cut list' });
    await user.click(screen.getByRole('button', { name: 'Cut list CSV' }));
    await user.click(screen.getByRole('button', { name: 'Bill of materials CSV' }));
    await user.click(screen.getByRole('button', { name: 'Element table CSV' }));
    expect(downloads.map((d) => d.name)).toEqual([
      'Shop-test-rev2-cut-list.csv',
      'Shop-test-rev2-bom.csv',
      'Shop-test-rev2-elements.csv',
    ]);
    const cut = Papa.parse<Record<string, string>>((await readBlob(downloads[0]!.blob)).trim(), {
      header: true,
    });
    expect(cut.meta.fields).toContain('cut length (in)');
    expect(cut.data.map((r) => r.element)).toEqual(['S1', 'B1', "'=S2"]); // a text cell a spreadsheet would run is neutralised
    expect(Number(cut.data[1]!['cut length (in)'])).toBeCloseTo(6 * Math.PI + 8, 4);
    const bom = Papa.parse<Record<string, string>>((await readBlob(downloads[1]!.blob)).trim(), {
      header: true,
    });
    expect(bom.meta.fields).toEqual(
      expect.arrayContaining(['length to order (in)', 'mass (lb)', 'schedule (as ordered)']),
    );
    const elements = await readBlob(downloads[2]!.blob);
    expect(elements.split('\n')[0]).toContain('MAWP (psi)');
  });

  it('the register sends a fabricator to the fabrication sheet of a released spool, and others to the sketch', async () => {
    renderAt('/spools');
    const released = await screen.findByRole('link', { name: 'Shop =test' });
    expect(released.getAttribute('href')).toBe('/spools/s1/fabrication');
    expect(screen.getByRole('link', { name: 'Draft one' }).getAttribute('href')).toBe('/spools/s2');
    cleanup();
    role = 'designer';
    renderAt('/spools');
    await waitFor(() => expect(fetch).toHaveBeenCalledWith('/api/me', expect.anything()));
    const link = await screen.findByRole('link', { name: 'Shop =test' });
    await waitFor(() => expect(link.getAttribute('href')).toBe('/spools/s1'));
  });
});

describe('shop settings in Design conditions', () => {
  it('applies test temperature and bending tangent, and names the field when invalid', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<ConditionsPanel readOnly={false} />, store);
    const form = screen.getByRole('form', { name: 'Shop settings' });
    const tangent = within(form).getByLabelText(/Bending tangent/);
    await user.type(tangent, '-2');
    await user.click(within(form).getByRole('button', { name: 'Apply shop settings' }));
    expect(await within(form).findByText('Bending tangent must be zero or more')).toBeTruthy();
    expect(store.getState().doc.shop).toBeUndefined();
    await user.clear(tangent);
    await user.type(tangent, '6');
    await user.type(within(form).getByLabelText(/Hydrotest temperature/), '60');
    await user.click(within(form).getByRole('button', { name: 'Apply shop settings' }));
    await waitFor(() =>
      expect(store.getState().doc.shop).toEqual({ testTemperature: 60, bendTangent: 6 }),
    );
  });
});
