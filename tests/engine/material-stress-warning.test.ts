import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import { checkSpool, SPOOL_STRESS_CODE } from '@shared/engine/index';
import { formatTable } from '@shared/cli/check';

// Rule (README, engine rules): an element that overrides only its material still takes the
// spool's explicit allowableStress (the override rules are unchanged); when its material differs
// from the spool's, the element carries a warning with code "material-vs-spool-stress".
// Stress values: A312 TP316L 16,700 psi at ≤100 °F (B31.3 Table A-1 as embedded in the library).

const base = (
  conditions: Partial<SpoolDocument['conditions']>,
  el: SpoolElement,
): SpoolDocument => ({
  units: 'imperial',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B', ...conditions },
  elements: [el],
});
const pipe = (conditions?: SpoolElement['conditions']): SpoolElement => ({
  id: 'S1',
  kind: 'straight',
  nps: '2',
  schedule: '40',
  length: 10,
  ...(conditions ? { conditions } : {}),
});
const S = (d: SpoolDocument) => checkSpool(d).elements[0]!.inputs.find((i) => i.symbol === 'S')!;

describe("material override vs the spool's explicit allowable stress", () => {
  it("warns when the element names TP316L but S is the spool's 20,000 psi; S itself is unchanged", () => {
    const doc = base({ allowableStress: 20000 }, pipe({ material: 'A312-TP316L' }));
    const e = checkSpool(doc).elements[0]!;
    const w = e.messages.find((m) => m.code === SPOOL_STRESS_CODE);
    expect(w?.level).toBe('warning');
    expect(w?.text).toContain('A312-TP316L');
    expect(w?.text).toContain('20000 psi');
    expect(S(doc).value).toBe(20000);
    expect(S(doc).source).toBe('spool conditions');
    // The headless checker's table prints it under the element.
    expect(formatTable(checkSpool(doc), doc)).toContain(`warning: ${w?.text ?? '-'}`);
  });

  it('no warning when the element gives its own allowableStress, when the material is the same (any spelling), or when the spool has no explicit S', () => {
    const cases: SpoolDocument[] = [
      base({ allowableStress: 20000 }, pipe({ material: 'A312-TP316L', allowableStress: 16700 })),
      base({ allowableStress: 20000 }, pipe({ material: 'a106 b' })),
      base({ allowableStress: 20000 }, pipe()),
      base({}, pipe({ material: 'A312-TP316L' })),
    ];
    for (const d of cases)
      expect(checkSpool(d).elements[0]!.messages.some((m) => m.code === SPOOL_STRESS_CODE)).toBe(
        false,
      );
    // Without the spool's S the element's own material table applies: 16,700 psi for TP316L at 100 °F.
    expect(S(cases[3]!).value).toBe(16700);
  });

  it('an element material override with the spool giving only allowableStress (no spool material) also warns', () => {
    const doc: SpoolDocument = {
      units: 'imperial',
      conditions: { pressure: 150, temperature: 100, allowableStress: 20000 },
      elements: [pipe({ material: 'A312-TP316L' })],
    };
    expect(checkSpool(doc).elements[0]!.messages.some((m) => m.code === SPOOL_STRESS_CODE)).toBe(
      true,
    );
  });
});
