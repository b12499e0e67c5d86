// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { DrawingBar } from '@/features/sketch/components/drawing-bar';
import { drawnStore, renderWithStore } from './helpers';

afterEach(cleanup);

const ids = (store: ReturnType<typeof drawnStore>) =>
  store
    .getState()
    .doc.elements.map((e) => e.id)
    .join(',');

describe('drawing bar', () => {
  it('draws legs by button and by key, converting a metric length to the document units', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store, 'metric');
    const length = screen.getByLabelText('Leg length');
    await user.clear(length);
    await user.type(length, '508');
    await user.click(screen.getByRole('button', { name: /^Draw leg South/ }));
    const last = store.getState().doc.elements.at(-1)!;
    // 508 mm = 20 in leg; the new bend's tangent (1.5 × 2 in × tan 45° = 3 in) comes off the cut length
    expect(last).toMatchObject({ kind: 'straight', direction: 'south', length: 17 });
    await user.click(document.body);
    await user.keyboard('{Control>}z{/Control}');
    expect(store.getState().doc.elements).toHaveLength(7);
    await user.keyboard('{PageDown}');
    expect(store.getState().doc.elements.at(-1)).toMatchObject({ direction: 'down' });
  });

  it('inserts after the selected element with Shift and reports refused legs', async () => {
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<DrawingBar canEdit />, store);
    await user.keyboard('{Shift>}{ArrowUp}{/Shift}');
    expect(screen.getByRole('alert').textContent).toContain('select an element first');
    store.getState().select('S1');
    const before = ids(store);
    await user.keyboard('{Shift>}{PageDown}{/Shift}');
    expect(ids(store)).not.toBe(before);
    expect(store.getState().doc.elements[1]).toMatchObject({ kind: 'bend', direction: 'down' });
    // the run ends going east: drawing west would double back
    await user.click(screen.getByRole('button', { name: /^Draw leg West/ }));
    expect(screen.getByRole('alert').textContent).toContain('double back');
  });

  it('offers no drawing controls to a member who may not edit', () => {
    renderWithStore(<DrawingBar canEdit={false} />, drawnStore());
    expect(screen.queryByRole('button', { name: /^Draw leg/ })).toBeNull();
    expect(screen.getByTestId('view-only')).toBeTruthy();
  });
});

describe('sketch tools', () => {
  it('sets dimension labels and edge smoothing in the store, and F asks for a fit', async () => {
    const { CanvasTools } = await import('@/features/sketch/components/canvas-tools');
    const user = userEvent.setup();
    const store = drawnStore();
    renderWithStore(<CanvasTools />, store);
    await user.click(screen.getByRole('button', { name: /View/ }));
    await user.click(screen.getByLabelText('on every element'));
    expect(store.getState().view.showDimensions).toBe('all');
    await user.click(screen.getByLabelText(/smooth edges/));
    expect(store.getState().view.antialias).toBe(true);
    const before = store.getState().view.fitRequest;
    await user.keyboard('f');
    expect(store.getState().view.fitRequest).toBe(before + 1);
    await user.keyboard('?');
    expect(screen.getByRole('dialog', { name: 'Sketcher keys' }).textContent).toContain('Ctrl + Z');
  });
});
