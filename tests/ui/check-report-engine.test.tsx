// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import type { SpoolDocument } from '@shared/model/spool';
import { checkSpool } from '@shared/engine';
import { CheckReport } from '@/features/sketch/components/check-report';

afterEach(cleanup);

// What the inspector's wall check shows of the engine's results (values come from the engine's own tests).
const doc: SpoolDocument = {
  units: 'imperial',
  conditions: {
    pressure: 2800,
    temperature: 100,
    material: 'A106-B',
    allowableStress: 20000,
    externalPressure: 14.7,
    elasticModulus: 29e6,
    yieldStrength: 35000,
  },
  elements: [
    {
      id: 'S1',
      kind: 'straight',
      nps: '2',
      schedule: '10',
      length: 40,
      conditions: { material: 'A312-TP316L' },
    },
  ],
};

describe('check report: engine fields', () => {
  it('shows the lightest schedule with its equal-wall name and standard (ASME B36.10M: NPS 2 Sch 80 = XS)', () => {
    render(<CheckReport check={checkSpool(doc).elements[0]!} schedule="10" />);
    expect(screen.getByTestId('lightest-schedule').textContent).toBe('80');
    expect(screen.getByTestId('lightest-standard').textContent).toBe('(= XS) ASME B36.10M');
  });
  it('shows both external-pressure values and which governs, marked from memory', () => {
    const check = checkSpool(doc).elements[0]!;
    render(<CheckReport check={check} schedule="10" />);
    const ext = check.cases.find((c) => c.case === 'external')!;
    expect(screen.getByTestId('external-ug28').textContent).toContain('psi');
    expect(screen.getByTestId('external-viii2').textContent).toContain('psi');
    expect(screen.getByTestId('external-basis').textContent).toContain('from memory');
    expect(ext.allowablePressure).toBe(Math.min(ext.allowableUg28!, ext.allowableVIII2!));
  });
  it('shows the material-vs-spool-stress warning', () => {
    const { container } = render(
      <CheckReport check={checkSpool(doc).elements[0]!} schedule="10" />,
    );
    const li = container.querySelector('[data-code="material-vs-spool-stress"]');
    expect(li?.textContent).toContain('A312-TP316L');
    expect(li?.className).toContain('amber');
  });
});
