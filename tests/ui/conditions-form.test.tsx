// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Conditions } from '@shared/model/spool';
import { ConditionsForm } from '@/features/sketch/components/conditions-form';
import { DisplayUnitsProvider } from '@/features/sketch/components/display-units';

afterEach(cleanup);

const conditions: Conditions = {
  pressure: 150,
  temperature: 100,
  material: 'A106-B',
  corrosionAllowance: 0.0625,
};

function renderForm(display: 'imperial' | 'metric' = 'imperial') {
  const onApply = vi.fn();
  render(
    <DisplayUnitsProvider doc="imperial" display={display}>
      <ConditionsForm conditions={conditions} onApply={onApply} />
    </DisplayUnitsProvider>,
  );
  return onApply;
}

describe('design conditions form', () => {
  it('names the field in each validation message and applies nothing while invalid', async () => {
    const user = userEvent.setup();
    const onApply = renderForm();
    // the material rule is checked once the fields themselves are valid
    await user.selectOptions(screen.getByLabelText('Material'), '');
    expect(
      await screen.findByText('Material must be chosen (or give an allowable stress S)'),
    ).toBeTruthy();

    const pressure = screen.getByLabelText(/Internal design pressure/);
    await user.clear(pressure);
    await user.type(pressure, '-5');
    expect(await screen.findByText('Internal design pressure must be zero or more')).toBeTruthy();

    const temperature = screen.getByLabelText(/Design temperature/);
    await user.clear(temperature);
    await user.type(temperature, 'hot');
    expect(await screen.findByText('Design temperature must be a number')).toBeTruthy();

    const tolerance = screen.getByLabelText(/Mill under-tolerance/);
    await user.type(tolerance, '12.5');
    expect(
      await screen.findByText('Mill under-tolerance must be less than 1 (a fraction, e.g. 0.125)'),
    ).toBeTruthy();

    await user.click(screen.getByRole('button', { name: 'Apply conditions' }));
    expect(onApply).not.toHaveBeenCalled();
    expect(pressure.getAttribute('aria-invalid')).toBe('true');
  });

  it('shows metric values and converts what is typed back to the document units', async () => {
    const user = userEvent.setup();
    const onApply = renderForm('metric');
    const pressure = screen.getByLabelText(/Internal design pressure/) as HTMLInputElement;
    // 150 psi = 1.03421 MPa (1 psi = 6894.757 Pa)
    expect(pressure.value).toBe('1.03421');
    expect(screen.getByLabelText('Internal design pressure (MPa)')).toBe(pressure);
    expect(screen.getByLabelText('Corrosion allowance (mm)')).toBeTruthy();
    await user.clear(pressure);
    await user.type(pressure, '2');
    await user.click(screen.getByRole('button', { name: 'Apply conditions' }));
    await waitFor(() => expect(onApply).toHaveBeenCalledTimes(1));
    const applied = onApply.mock.calls[0]![0] as Conditions;
    // 2 MPa = 290.075 psi; the untouched fields keep their exact stored values
    expect(applied.pressure).toBeCloseTo(290.0755, 3);
    expect(applied.temperature).toBe(100);
    expect(applied.corrosionAllowance).toBe(0.0625);
  });
});

describe('material picker', () => {
  it('lists team materials first and keeps an unknown stored material as an option', async () => {
    const { MaterialChoicesProvider } = await import(
      '@/features/sketch/components/material-choices'
    );
    render(
      <DisplayUnitsProvider doc="imperial" display="imperial">
        <MaterialChoicesProvider
          choices={[
            { id: 'TEAM-1', label: 'Team spec 1 — test (team)', team: true },
            { id: 'A106-B', label: 'ASTM A106 B', team: false },
          ]}
        >
          <ConditionsForm
            conditions={{ ...conditions, material: 'OLD-9' }}
            onApply={() => undefined}
          />
        </MaterialChoicesProvider>
      </DisplayUnitsProvider>,
    );
    const picker = screen.getByLabelText('Material') as HTMLSelectElement;
    expect([...picker.options].map((o) => o.value)).toEqual(['', 'OLD-9', 'TEAM-1', 'A106-B']);
    expect(picker.value).toBe('OLD-9');
  });
});
