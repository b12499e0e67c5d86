// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { CAUTION } from '@shared/model/caution';
import { checkSpool } from '@shared/engine';
import { ElementInspector } from '@/features/sketch/components/element-inspector';
import { drawnStore, renderWithStore } from './helpers';

afterEach(cleanup);

describe('element inspector', () => {
  it('validates the straight form with messages that name the field', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store);
    const length = screen.getByLabelText(/^Length/);
    await user.clear(length);
    await user.type(length, '0');
    expect(await screen.findByText('Length must be greater than zero')).toBeTruthy();
    await user.clear(length);
    expect(await screen.findByText('Length must be a number')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    // nothing was applied: the straight keeps its cut length
    expect(store.getState().doc.elements.find((e) => e.id === 'S1')).toMatchObject({ length: 33 });
    expect(screen.getAllByText(CAUTION, { exact: false }).length).toBeGreaterThan(0);
  });

  it('validates the bend form and applies a valid change as one undo step', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().select('B1');
    renderWithStore(<ElementInspector />, store);
    const angle = screen.getByLabelText(/^Bend angle/);
    await user.clear(angle);
    await user.type(angle, '200');
    expect(await screen.findByText('Bend angle must be at most 180 degrees')).toBeTruthy();
    const radius = screen.getByLabelText(/^Bend radius \(/);
    await user.clear(radius);
    await user.type(radius, '-1');
    expect(await screen.findByText('Bend radius must be greater than zero')).toBeTruthy();

    await user.clear(angle);
    await user.type(angle, '90');
    await user.clear(radius);
    await user.type(radius, '3');
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() =>
      expect(store.getState().doc.elements.find((e) => e.id === 'B1')).toMatchObject({
        bendRadius: { multipleOfD: 3 },
      }),
    );
    expect(store.getState().past).toHaveLength(1);
  });

  it('shows the governing case and the wall figures of the selected bend', () => {
    const store = drawnStore(1100);
    store.getState().select('B1');
    renderWithStore(<ElementInspector />, store);
    expect(screen.getByTestId('governing-case').textContent).toBe('bend intrados');
    expect(screen.getByTestId('case-table').textContent).toContain('bend extrados');
    expect(screen.getByTestId('case-table').textContent).toContain('bend sidewall');
    expect(screen.getByTestId('pre-bend').textContent).toContain('table factor');
    expect(screen.getAllByTestId('trail-step').length).toBeGreaterThan(0);
  });

  it('"use" of the lightest passing schedule updates the store and the check', async () => {
    const user = userEvent.setup();
    // 1100 psi on 2" Sch 40 A106 B: the 1.5D bends fail at the intrados (see the e2e journey)
    const store = drawnStore(1100);
    expect(checkSpool(store.getState().doc).elements.find((e) => e.id === 'B1')?.status).toBe(
      'fail',
    );
    store.getState().select('B1');
    renderWithStore(<ElementInspector />, store);
    const lightest = screen.getByTestId('lightest-schedule').textContent!;
    expect(lightest).toBe('80');
    await user.click(screen.getByRole('button', { name: `Use schedule ${lightest}` }));
    const b1 = store.getState().doc.elements.find((e) => e.id === 'B1');
    expect(b1?.schedule).toBe('80');
    expect(store.getState().canUndo).toBe(true);
    expect(checkSpool(store.getState().doc).elements.find((e) => e.id === 'B1')?.status).toBe(
      'pass',
    );
    expect(await screen.findByRole('button', { name: 'in use' })).toBeTruthy();
  });

  it('applies element overrides of the spool conditions', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().select('S2');
    renderWithStore(<ElementInspector />, store);
    await user.click(screen.getByText(/Overrides of the spool conditions/));
    const form = screen.getByRole('form', { name: 'Element overrides' });
    const pressure = form.querySelector('input') as HTMLInputElement;
    expect(pressure.placeholder).toBe('inherit 150');
    await user.type(pressure, 'x');
    expect(await screen.findByText('Internal design pressure must be a number')).toBeTruthy();
    await user.clear(pressure);
    await user.type(pressure, '400');
    await user.click(screen.getByRole('button', { name: 'Apply overrides' }));
    await waitFor(() =>
      expect(store.getState().doc.elements.find((e) => e.id === 'S2')?.conditions).toEqual({
        pressure: 400,
      }),
    );
  });
});

describe('element form pickers', () => {
  it('moves to a listed schedule when the new NPS does not list the chosen one', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().updateElement('S1', { schedule: '10S' }, { history: 'never' });
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store);
    const schedule = screen.getByLabelText('Schedule') as HTMLSelectElement;
    expect(schedule.value).toBe('10S');
    // NPS 26 has no stainless (S) schedules in ASME B36.19M; the tables list 10, STD, 20, XS for it
    await user.selectOptions(screen.getByLabelText('NPS'), '26');
    await waitFor(() => expect(schedule.value).not.toBe('10S'));
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() =>
      expect(store.getState().doc.elements.find((e) => e.id === 'S1')).toMatchObject({ nps: '26' }),
    );
    expect(store.getState().doc.elements.find((e) => e.id === 'S1')?.schedule).not.toBe('10S');
  });
});

describe('inputs and their sources', () => {
  it('flags values recalled from memory', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    // A106 B at 800 °F: S comes from the rows the materials table marks as from memory
    store.getState().setConditions({ temperature: 800 }, { history: 'never' });
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store);
    await user.click(screen.getByText('Inputs and their sources'));
    const table = screen.getByTestId('inputs-table');
    const sRow = [...table.querySelectorAll('tr')].find(
      (tr) => tr.querySelector('td')?.textContent === 'S',
    )!;
    expect(sRow.textContent).toContain('from memory — verify');
    const dRow = [...table.querySelectorAll('tr')].find(
      (tr) => tr.querySelector('td')?.textContent === 'D',
    )!;
    expect(dRow.textContent).not.toContain('from memory — verify');
  });
});
