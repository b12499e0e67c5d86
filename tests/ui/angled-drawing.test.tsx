// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { isBend, isStraight } from '@shared/model/spool';
import { CanvasTools } from '@/features/sketch/components/canvas-tools';
import { DrawingBar } from '@/features/sketch/components/drawing-bar';
import { KEY_HELP } from '@/features/sketch/components/sketch-keys';
import { drawnStore, renderWithStore } from './helpers';

afterEach(cleanup);

// The helper spool runs east at its end; NPS 2 with 1.5D bends: R = 3 in (common practice
// "nD" = n × NPS); a 45° bend takes R·tan(22.5°) = 1.242641 in from each leg.
const T45 = 3 * Math.tan(Math.PI / 8);

describe('angled legs in the drawing bar', () => {
  it('draws "45° from east toward north" with a 45° bend and says so', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    await user.click(screen.getByRole('button', { name: 'Angled…' }));
    const group = screen.getByRole('group', { name: 'Angled leg' });
    expect(within(group).getByTestId('angled-preview').textContent).toBe(
      "45° from east toward north · bend at the run's end 45°",
    );
    const length = screen.getByLabelText('Leg length');
    await user.clear(length);
    await user.type(length, '24');
    await user.click(within(group).getByRole('button', { name: 'Draw angled leg' }));
    const els = store.getState().doc.elements;
    const bend = els.filter(isBend).at(-1)!;
    expect(bend.angle).toBe(45);
    const leg = els.at(-1)!;
    expect(leg).toMatchObject({
      kind: 'straight',
      heading: { east: 0.707106781187, north: 0.707106781187, up: 0 },
    });
    expect(isStraight(leg) && leg.length).toBeCloseTo(24 - T45, 5);
    expect(screen.getByTestId('edit-notice').textContent).toContain(
      'leg 45° from east toward north',
    );
  });

  it('rolls a leg up from east by 30°: a 30° bend', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    await user.click(screen.getByRole('button', { name: 'Angled…' }));
    await user.selectOptions(screen.getByLabelText('Angled leg toward'), 'up');
    const angle = screen.getByLabelText('Angled leg angle');
    await user.clear(angle);
    await user.type(angle, '30');
    expect(screen.getByTestId('angled-preview').textContent).toContain('30° from east toward up');
    await user.click(screen.getByRole('button', { name: 'Draw angled leg' }));
    expect(store.getState().doc.elements.filter(isBend).at(-1)!.angle).toBe(30);
  });

  it('draws a rolled offset leg: 45° from east toward north, rolled 30° toward up', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    await user.click(screen.getByRole('button', { name: 'Angled…' }));
    await user.selectOptions(screen.getByLabelText('Angled leg roll toward'), 'up');
    const roll = screen.getByLabelText('Angled leg roll');
    await user.clear(roll);
    await user.type(roll, '30');
    expect(screen.getByTestId('angled-preview').textContent).toBe(
      "45° from east toward north, rolled 30° toward up · bend at the run's end 45°",
    );
    await user.click(screen.getByRole('button', { name: 'Draw angled leg' }));
    const leg = store.getState().doc.elements.at(-1)!;
    // cos45·E + sin45·(cos30·N + sin30·Up)
    expect(leg.heading!.east).toBeCloseTo(Math.SQRT1_2, 9);
    expect(leg.heading!.north).toBeCloseTo(Math.SQRT1_2 * Math.cos(Math.PI / 6), 9);
    expect(leg.heading!.up).toBeCloseTo(Math.SQRT1_2 / 2, 9);
    expect(store.getState().doc.elements.filter(isBend).at(-1)!.angle).toBe(45);
  });

  it('names the field in every refusal and draws nothing', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    const before = store.getState().doc;
    await user.click(screen.getByRole('button', { name: 'Angled…' }));
    await user.selectOptions(screen.getByLabelText('Angled leg toward'), 'west');
    const errors = await screen.findByTestId('angled-errors');
    expect(errors.textContent).toContain(
      'Toward must be perpendicular to east: choose north, south, up or down',
    );
    await user.selectOptions(screen.getByLabelText('Angled leg toward'), 'north');
    const angle = screen.getByLabelText('Angled leg angle');
    await user.clear(angle);
    await user.type(angle, '180');
    expect(screen.getByTestId('angled-errors').textContent).toContain(
      'Angle must be more than 0° and less than 180°',
    );
    await user.click(screen.getByRole('button', { name: 'Draw angled leg' }));
    expect(screen.getByTestId('edit-notice').textContent).toContain('Angle must be more than 0°');
    await user.clear(angle);
    await user.type(angle, 'abc');
    expect(screen.getByTestId('angled-errors').textContent).toContain('Angle must be a number');
    await user.clear(angle);
    await user.type(angle, '45');
    const roll = screen.getByLabelText('Angled leg roll');
    await user.clear(roll);
    await user.type(roll, '20');
    expect(screen.getByTestId('angled-errors').textContent).toContain(
      'Roll toward must be chosen for a roll above 0°',
    );
    await user.selectOptions(screen.getByLabelText('Angled leg roll toward'), 'east');
    expect(screen.getByTestId('angled-errors').textContent).toContain(
      'Roll toward must be perpendicular to east and north: choose up or down',
    );
    await user.clear(roll);
    await user.type(roll, '95');
    expect(screen.getByTestId('angled-errors').textContent).toContain(
      'Roll must be from 0° to 90°',
    );
    expect(store.getState().doc).toBe(before);
  });

  it('reports a leg too short for its 45° bend from the store', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    await user.click(screen.getByRole('button', { name: 'Angled…' }));
    const length = screen.getByLabelText('Leg length');
    await user.clear(length);
    await user.type(length, '1');
    await user.click(screen.getByRole('button', { name: 'Draw angled leg' }));
    expect(screen.getByRole('alert').textContent).toMatch(
      /this leg \(1 in\) is too short for its bend: it must be longer than 1\.243 in/,
    );
  });
});

describe('focus on selected', () => {
  it('asks the canvas to zoom to the selection by button and by Shift+F, listed in the keys', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<CanvasTools />, store);
    const focus = screen.getByRole('button', { name: 'Focus' });
    expect((focus as HTMLButtonElement).disabled).toBe(true);
    await user.keyboard('{Shift>}F{/Shift}');
    expect(store.getState().view.focus).toBeNull();
    store.getState().select('B2');
    await user.click(await screen.findByRole('button', { name: 'Focus' }));
    expect(store.getState().view.focus).toEqual({ id: 'B2', request: 1 });
    await user.keyboard('{Shift>}F{/Shift}');
    expect(store.getState().view.focus).toEqual({ id: 'B2', request: 2 });
    // plain F still fits the whole spool
    const fits = store.getState().view.fitRequest;
    await user.keyboard('f');
    expect(store.getState().view.fitRequest).toBe(fits + 1);
    expect(KEY_HELP.some((k) => k.keys === 'Shift + F' && /focus/.test(k.what))).toBe(true);
  });
});
