// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MaterialsPage } from '@/features/materials/components/materials-page';
import { csvFile, mockApi, renderAt } from './admin-helpers';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Invented rows for the component (not from any table).
const library = {
  id: 'A106-B',
  spec: 'ASTM A106',
  grade: 'B',
  name: 'Carbon steel, seamless',
  origin: 'library',
  source: 'Built-in source text',
  stress: [
    { tempF: 100, value: 20000 },
    { tempF: 200, value: 20000, fromMemory: true },
  ],
};
const team = {
  id: 'KX-1',
  spec: 'Owner KX',
  grade: '1',
  name: 'Owner KX 1',
  origin: 'team',
  sourceNote: 'Owner spec KX rev C, table 2',
  source: 'Team',
  stress: [{ tempF: 100, value: 18000 }],
};

function api(extra: Parameters<typeof mockApi>[1] = {}) {
  return mockApi('admin', {
    'GET /api/materials': () => ({ body: { items: [team, library] } }),
    ...extra,
  });
}

describe('materials page', () => {
  it('lists built-in and team rows with source note and from-memory flag; built-in rows are read-only', async () => {
    api();
    renderAt(<MaterialsPage />, '/materials');
    const teamRow = (await screen.findByText('KX-1')).closest('tr')!;
    expect(within(teamRow).getByText('Owner spec KX rev C, table 2')).toBeTruthy();
    expect(within(teamRow).getByText('Team')).toBeTruthy();
    expect(within(teamRow).getByRole('button', { name: 'Delete KX-1' })).toBeTruthy();
    const libRow = screen.getByText('A106-B').closest('tr')!;
    expect(within(libRow).getByText('Built-in')).toBeTruthy();
    expect(libRow.querySelector('[data-from-memory]')!.textContent).toBe('some rows');
    expect(within(libRow).getByText('read-only')).toBeTruthy();
    expect(within(libRow).queryByRole('button')).toBeNull();
  });

  it('the form names every missing field, the source note included, and sends nothing', async () => {
    const calls = api();
    const user = userEvent.setup();
    renderAt(<MaterialsPage />, '/materials');
    const form = await screen.findByRole('form', { name: 'Add a team material' });
    await user.click(within(form).getByRole('button', { name: 'Add material' }));
    expect(await within(form).findByText(/^Material id use 1–40 letters/)).toBeTruthy();
    expect(within(form).getByText('Specification is required')).toBeTruthy();
    expect(within(form).getByText(/^Tensile strength must be a number/)).toBeTruthy();
    expect(within(form).getByText(/^Row 1 temperature must be a temperature/)).toBeTruthy();
    expect(within(form).getByText(/^Source note give the source of the values/)).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it('adds a material from the form and says how many spools were re-checked', async () => {
    const calls = api({
      'POST /api/materials': (c) => ({
        status: 201,
        body: {
          item: { ...JSON.parse(c.body!), name: 'Owner KX 2' },
          replaces: null,
          rechecked: 4,
        },
      }),
    });
    const user = userEvent.setup();
    renderAt(<MaterialsPage />, '/materials');
    const form = await screen.findByRole('form', { name: 'Add a team material' });
    await user.type(within(form).getByLabelText('Material id'), 'KX-2');
    await user.type(within(form).getByLabelText('Specification'), 'Owner KX');
    await user.type(within(form).getByLabelText('Grade'), '2');
    await user.type(within(form).getByLabelText(/^Tensile strength/), '60');
    await user.type(within(form).getByLabelText(/^Yield strength/), '35');
    await user.type(within(form).getByLabelText(/^Row 1: temperature/), '100');
    await user.type(within(form).getByLabelText(/^Row 1: allowable stress/), '20');
    await user.click(within(form).getByRole('button', { name: 'Add a temperature row' }));
    await user.type(within(form).getByLabelText(/^Row 2: temperature/), '100');
    await user.type(within(form).getByLabelText(/^Row 2: allowable stress/), '19');
    await user.type(within(form).getByLabelText('Source note'), 'Owner spec KX rev C, table 2');
    await user.click(within(form).getByRole('button', { name: 'Add material' }));
    expect(await within(form).findByText('Row 2 temperature 100 °F appears twice')).toBeTruthy();
    await user.clear(within(form).getByLabelText(/^Row 2: temperature/));
    await user.type(within(form).getByLabelText(/^Row 2: temperature/), '400');
    await user.click(within(form).getByRole('button', { name: 'Add material' }));
    expect((await screen.findByTestId('rechecked')).textContent).toBe(
      '4 spools re-checked against the updated library.',
    );
    const sent = JSON.parse(calls.find((c) => c.method === 'POST')!.body!);
    expect(sent).toMatchObject({
      id: 'KX-2',
      tensileKsi: 60,
      points: [
        { tempF: 100, stressKsi: 20 },
        { tempF: 400, stressKsi: 19 },
      ],
      sourceNote: 'Owner spec KX rev C, table 2',
      fromMemory: false,
    });
  });

  it('CSV: the dry run shows every problem by line and column; import only after a clean check', async () => {
    let clean = false;
    const calls = api({
      'POST /api/materials/import/preview': () =>
        clean
          ? {
              body: {
                ok: true,
                issues: [],
                items: [
                  {
                    id: 'KX-3',
                    spec: 'S',
                    grade: '3',
                    name: 'S 3',
                    rows: 2,
                    minTempF: 100,
                    maxTempF: 300,
                    fromMemory: true,
                    replaces: null,
                  },
                ],
              },
            }
          : {
              body: {
                ok: false,
                items: [],
                issues: [
                  {
                    line: 3,
                    column: 'stress_ksi',
                    path: 'line 3: stress_ksi',
                    message: 'stress_ksi must be a number',
                  },
                  {
                    line: 4,
                    column: 'from_memory',
                    path: 'line 4: from_memory',
                    message: 'from_memory must be yes or no',
                  },
                ],
              },
            },
      'POST /api/materials/import': () => ({
        status: 201,
        body: { imported: 1, items: [], rechecked: 7 },
      }),
    });
    const user = userEvent.setup();
    renderAt(<MaterialsPage />, '/materials');
    await screen.findByText('KX-1');
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    expect(await screen.findByText('CSV file: choose a file first')).toBeTruthy();
    await user.upload(screen.getByLabelText('CSV file'), csvFile('id,spec\nKX-3,S\n'));
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    expect(await screen.findByText(/^Source note: give the source/)).toBeTruthy();
    await user.type(screen.getByLabelText('Source note for the file'), 'Owner spec KX');
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    const issues = await screen.findByTestId('csv-issues');
    const rows = within(issues).getAllByRole('row').slice(1);
    expect(rows.map((r) => [r.getAttribute('data-line'), r.getAttribute('data-column')])).toEqual([
      ['3', 'stress_ksi'],
      ['4', 'from_memory'],
    ]);
    expect(within(rows[0]!).getByText('stress_ksi must be a number')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /^Import/ })).toBeNull();
    const preview = calls.find((c) => c.path === '/api/materials/import/preview')!;
    expect(preview.contentType).toBe('text/csv');
    expect(preview.search.get('source')).toBe('Owner spec KX');
    expect(preview.body).toBe('id,spec\nKX-3,S\n');

    clean = true;
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    expect(await screen.findByTestId('materials-preview')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Import 1 material' }));
    expect((await screen.findByTestId('rechecked')).textContent).toBe(
      '7 spools re-checked against the updated library.',
    );
    await waitFor(() =>
      expect(calls.filter((c) => c.path === '/api/materials/import').length).toBe(1),
    );
  });

  it('deletes a team material after confirmation and reports the re-check', async () => {
    const calls = api({
      'DELETE /api/materials/KX-1': () => ({ body: { deleted: 'KX-1', rechecked: 3 } }),
    });
    const user = userEvent.setup();
    renderAt(<MaterialsPage />, '/materials');
    await user.click(await screen.findByRole('button', { name: 'Delete KX-1' }));
    await user.click(screen.getByRole('button', { name: 'Confirm delete' }));
    expect((await screen.findByTestId('rechecked')).textContent).toBe(
      '3 spools re-checked against the updated library.',
    );
    expect(calls.some((c) => c.method === 'DELETE')).toBe(true);
  });
});
