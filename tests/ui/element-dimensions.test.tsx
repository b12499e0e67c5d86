// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { checkSpool } from '@shared/engine';
import { ElementInspector } from '@/features/sketch/components/element-inspector';
import { checkElementInUnits } from '@/features/sketch/components/display-check';
import { drawnStore, renderWithStore } from './helpers';

afterEach(cleanup);

const el = (store: ReturnType<typeof drawnStore>, id: string) =>
  store.getState().doc.elements.find((e) => e.id === id)!;

describe('explicit dimensions in the element form', () => {
  it('edits OD and nominal wall in metric display of an imperial spool, stored in inches', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store, 'metric');
    // NPS 2 Sch 40: OD 60.3 mm, wall 3.91 mm (ASME B36.10M Table 1), offered as what empty means
    expect(screen.getByText('empty: 60.325 mm from the NPS')).toBeTruthy();
    expect(screen.getByText('empty: 3.9116 mm from the schedule')).toBeTruthy();
    const od = screen.getByLabelText(/^Outside diameter D/);
    const wall = screen.getByLabelText(/^Nominal wall T/);
    await user.type(od, '60.3');
    await user.type(wall, '5.54');
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() => expect(el(store, 'S1').nominalWall).toBeCloseTo(5.54 / 25.4, 9));
    expect(el(store, 'S1').outsideDiameter).toBeCloseTo(60.3 / 25.4, 9); // 2.374016 in
    expect(store.getState().past).toHaveLength(1);
    // The form shows the stored values back in mm.
    await waitFor(() =>
      expect((screen.getByLabelText(/^Nominal wall T/) as HTMLInputElement).value).toBe('5.54'),
    );
    // The check uses the explicit wall: D from the element, T = 0.218110 in.
    const inputs = screen.getByTestId('inputs-table').textContent ?? '';
    expect(inputs).toContain('element nominalWall');
  });

  it('validates the dimensions with messages naming the field', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store, 'metric');
    const od = screen.getByLabelText(/^Outside diameter D/);
    const wall = screen.getByLabelText(/^Nominal wall T/);
    const id = screen.getByLabelText(/^Inside diameter d/);
    await user.type(od, '-5');
    expect(await screen.findByText('Outside diameter D must be greater than zero')).toBeTruthy();
    await user.clear(od);
    await user.type(od, '60.3');
    await user.type(wall, '40');
    expect(
      await screen.findByText('Nominal wall T must be less than half the outside diameter (30.15)'),
    ).toBeTruthy();
    await user.clear(wall);
    await user.type(wall, '5.54');
    await user.type(id, '50');
    expect(
      await screen.findByText('Inside diameter d must equal D − 2T = 49.22, or be left empty'),
    ).toBeTruthy();
    await user.clear(id);
    await user.selectOptions(screen.getByLabelText('NPS'), '');
    await user.clear(od);
    expect(await screen.findByText(/^Outside diameter D give an outside diameter/)).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    expect(el(store, 'S1')).toMatchObject({ nps: '2', schedule: '40' });
    expect(el(store, 'S1').outsideDiameter).toBeUndefined();
    expect(store.getState().past).toHaveLength(0);
  });

  it('refuses in the store an element left without any size', () => {
    const store = drawnStore();
    const r = store.getState().updateElement('S1', { nps: undefined });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('nps: give nps (with schedule) or outsideDiameter');
  });
});

describe('equation trail in display units', () => {
  it('shows mm and MPa in the substituted equations of an imperial spool shown in metric', async () => {
    const store = drawnStore(150);
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store, 'metric');
    expect(screen.getByTestId('trail-units').textContent).toContain('mm, MPa, °C');
    const steps = screen.getAllByTestId('trail-step').map((s) => s.textContent ?? '');
    const eq3a = steps.find((s) => s.includes('Eq. (3a)'))!;
    // D = 2.375 in = 60.325 mm (ASME B36.10M NPS 2), P = 150 psi = 1.034 MPa, S = 20.0 ksi
    // = 137.9 MPa (A106 B at 100 °F, B31.3 Table A-1), shown to 4 significant figures (60.325 prints as 60.32)
    expect(eq3a).toContain('t = 1.034 × 60.32 / (2 × (137.9 × 1 × 1 + 1.034 × 0.4))');
    expect(eq3a).not.toContain('2.375');
    expect(eq3a).toMatch(/ mm$/);
    // The restated check agrees with the document's check, converted.
    const doc = store.getState().doc;
    const docCheck = checkSpool(doc).elements[0]!;
    const metric = checkElementInUnits(doc, doc.elements[0]!, 'metric')!;
    expect(metric.requiredNominalWall).toBeCloseTo(docCheck.requiredNominalWall * 25.4, 6);
    expect(metric.mawp).toBeCloseTo(docCheck.mawp * 0.00689475729, 6);
  });

  it('keeps the document units in the trail when the display matches', () => {
    const store = drawnStore(150);
    store.getState().select('S1');
    renderWithStore(<ElementInspector />, store, 'imperial');
    const eq3a = screen
      .getAllByTestId('trail-step')
      .map((s) => s.textContent ?? '')
      .find((s) => s.includes('Eq. (3a)'))!;
    expect(eq3a).toContain('2.375');
    expect(eq3a).toMatch(/ in$/);
  });
});

describe('bend angle in the element form', () => {
  it('turns the leg after the bend: 90° → 45° makes the next bend 45° as well', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    // drawn east, north, up, east: B1 turns east → north
    store.getState().select('B1');
    renderWithStore(<ElementInspector />, store);
    const angle = screen.getByLabelText(/^Bend angle/);
    await user.clear(angle);
    await user.type(angle, '45');
    await user.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() => expect(el(store, 'B1')).toMatchObject({ angle: 45 }));
    // the north leg now runs 45° between east and north; B2 (to up) stays 90°
    expect(el(store, 'S2').heading).toEqual({ east: 0.707106781187, north: 0.707106781187, up: 0 });
    expect(el(store, 'B2')).toMatchObject({ angle: 90 });
    expect(store.getState().past).toHaveLength(1);
  });
});
