// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { checkSpool } from '@shared/engine';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import { ElementTable } from '@/features/sketch/components/element-table';
import { drawnStore } from './helpers';

afterEach(cleanup);

const idsInOrder = () =>
  within(screen.getByTestId('element-table'))
    .getAllByRole('row')
    .map((r) => r.getAttribute('data-element-id'))
    .filter((id): id is string => id !== null);

describe('element list', () => {
  it('sorts, filters by check and reports clicks as selection', async () => {
    const user = userEvent.setup();
    const doc = drawnStore(1100).getState().doc;
    const onSelect = vi.fn();
    render(
      <ElementTable
        elements={doc.elements}
        checks={checkSpool(doc).elements}
        selectedId="B2"
        onSelect={onSelect}
      />,
    );
    expect(idsInOrder()).toEqual(['S1', 'B1', 'S2', 'B2', 'S3', 'B3', 'S4']);
    expect(
      screen
        .getByTestId('element-table')
        .querySelector('[aria-selected="true"]')
        ?.getAttribute('data-element-id'),
    ).toBe('B2');

    await user.selectOptions(screen.getByLabelText('Filter elements by check'), 'fail');
    expect(idsInOrder()).toEqual(['B1', 'B2', 'B3']);
    await user.selectOptions(screen.getByLabelText('Filter elements by check'), '');

    await user.click(screen.getByRole('button', { name: /^Check/ }));
    const sorted = idsInOrder();
    expect(sorted.slice(0, 4).every((id) => id.startsWith('S'))).toBe(true);

    await user.click(within(screen.getByTestId('element-table')).getByText('S3'));
    expect(onSelect).toHaveBeenCalledWith('S3');
  });

  it('renders only the rows in view for a long spool', () => {
    const elements: SpoolElement[] = Array.from({ length: 1000 }, (_, i) => ({
      kind: 'straight',
      id: `S${i + 1}`,
      nps: '2',
      schedule: '40',
      length: 10,
      direction: 'east',
    }));
    const doc: SpoolDocument = {
      units: 'imperial',
      conditions: { pressure: 150, temperature: 100, material: 'A106-B' },
      elements,
    };
    render(
      <ElementTable
        elements={doc.elements}
        checks={checkSpool(doc).elements}
        selectedId={null}
        onSelect={() => undefined}
      />,
    );
    expect(screen.getByTestId('element-count').textContent).toBe('1000 of 1000');
    expect(idsInOrder().length).toBeLessThan(100);
    expect(idsInOrder()[0]).toBe('S1');
  });
});
