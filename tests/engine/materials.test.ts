import { describe, expect, it } from 'vitest';
import { interpolate } from '../../shared/data/interpolate';
import {
  MATERIALS,
  allowableStressAt,
  createMaterialLookup,
  elasticModulusAt,
  findMaterial,
  yieldStrengthAt,
  type Material,
  type ModulusGroup,
} from '../../shared/data/materials';

const get = (id: string): Material => {
  const m = findMaterial(id);
  if (m === undefined) throw new Error(`material ${id} missing`);
  return m;
};

const okValue = (r: ReturnType<typeof allowableStressAt>): number => {
  if (!r.ok) throw new Error(r.reason);
  return r.value;
};

describe('interpolate', () => {
  const table = [
    { x: 100, y: 20 },
    { x: 200, y: 10, fromMemory: true },
    { x: 300, y: 0 },
  ];
  it.each([
    // [x, value, fromMemory] — straight-line interpolation (B31.3 Table A-1 general notes permit it)
    [50, 20, false], // below the first x: the first value (≤100 column)
    [100, 20, false],
    [150, 15, true], // bracketing point at 200 is from memory
    [200, 10, true],
    [250, 5, true],
    [300, 0, false],
  ])('at x = %d gives %d (fromMemory %s)', (x, value, fromMemory) => {
    const r = interpolate(table, x);
    expect(r?.value).toBeCloseTo(value, 10);
    expect(r?.fromMemory).toBe(fromMemory);
  });
  it('never extrapolates above the last point, and rejects empty tables and NaN', () => {
    expect(interpolate(table, 300.0001)).toBeUndefined();
    expect(interpolate([], 100)).toBeUndefined();
    expect(interpolate(table, Number.NaN)).toBeUndefined();
  });
});

describe('library integrity', () => {
  it('holds at least 10 materials with unique ids', () => {
    expect(MATERIALS.length).toBeGreaterThanOrEqual(10);
    expect(new Set(MATERIALS.map((m) => m.id)).size).toBe(MATERIALS.length);
  });
  it.each(MATERIALS.map((m) => [m.id, m] as const))(
    '%s: has stresses, a source, sorted temperatures, S non-increasing above 100 °F',
    (_id, m) => {
      expect(m.stress.length).toBeGreaterThanOrEqual(1);
      expect(m.source.trim().length).toBeGreaterThan(10);
      expect(m.productForms.length).toBeGreaterThanOrEqual(1);
      for (let i = 1; i < m.stress.length; i++) {
        expect(m.stress[i]!.tempF).toBeGreaterThan(m.stress[i - 1]!.tempF);
        // Sanity: allowable stress does not rise with temperature (B31.3 Table A-1 basis, para. 302.3.2).
        if (m.stress[i - 1]!.tempF >= 100)
          expect(m.stress[i]!.value).toBeLessThanOrEqual(m.stress[i - 1]!.value);
      }
      for (const row of [m.stress, m.yield ?? []]) {
        for (const p of row) expect(Number.isFinite(p.value) && p.value > 0).toBe(true);
      }
      // Every value recalled from memory is flagged and the material says so.
      if ([...m.stress, ...(m.yield ?? [])].some((p) => p.fromMemory === true)) {
        expect(m.source + m.notes.join(' ')).toContain(
          'from memory, verify against the licensed edition',
        );
      }
      // S never exceeds the lesser of ST/3 and 2SY/3 at the lowest temperature (para. 302.3.2 basis), 0.1 ksi print rounding.
      expect(m.stress[0]!.value).toBeLessThanOrEqual(
        Math.min(m.tensilePsi / 3, (2 * m.yieldPsi) / 3) + 100,
      );
    },
  );
  it('leaves out TP347: no stress row was found or recalled', () => {
    expect(findMaterial('A312-TP347')).toBeUndefined();
  });
});

describe('allowable stress S, B31.3 Table A-1', () => {
  it.each([
    // [material, °F, psi, fromMemory, source]
    ['A106-B', 70, 20_000, false], // ≤100 °F column, pipe-mill P-T page citing B31.3-2002 [pub]
    ['A106-B', 400, 20_000, false], // B31.3 Table A-1 via published rating pages [pub]
    ['A106-B', 500, 18_900, false], // B31.3 Table A-1 via published rating pages [pub]
    ['A106-B', 450, 19_450, false], // straight-line interpolation of the two [pub] values
    ['A106-B', 700, 16_500, false], // pipe-mill P-T page citing B31.3-2002 [pub]
    ['A106-B', 800, 10_800, true], // from memory, verify against the licensed edition
    ['A106-B', 725, 14_750, true], // interpolated 700 [pub] – 750 [mem] → flagged from memory
    ['A53-B', 500, 18_900, false], // same carbon-steel line [pub]
    ['API5L-B', 600, 17_300, false], // same carbon-steel line [pub]
    ['A333-6', -50, 20_000, false], // ≤100 °F column; −50 °F minimum, product sheets [pub]
    ['A312-TP316', 1000, 15_300, false], // published A312/A376 TP316 P-T sheet [pub]
    ['A312-TP316', 1200, 7_400, false], // published A312/A376 TP316 P-T sheet [pub]
    ['A312-TP316', 1050, 14_500, false], // P-T sheet value [pub] (newer editions 15.1 ksi, from memory)
    ['A312-TP316', 500, 18_000, true], // ≤700 °F from memory, verify against the licensed edition
    ['A312-TP304', 400, 18_600, true], // from memory, verify against the licensed edition
    ['A312-TP316L', 100, 16_700, true], // from memory, verify against the licensed edition
    ['A335-P11', 1000, 6_300, false], // mill data sheet reproducing B31.3 allowables [pub]
    ['A335-P22', 900, 12_800, false], // mill data sheet reproducing B31.3 allowables [pub]
    ['A335-P5', 800, 12_800, false], // mill data sheet reproducing B31.3 allowables [pub]
    ['A335-P91', 1000, 18_000, false], // mill data sheet reproducing B31.3 allowables [pub]
    ['A335-P91', 100, 28_300, false], // ST/3 = 85/3 ksi, derived per para. 302.3.2
    ['A335-P11', 200, 19_000, false], // interpolation 100–300 °F across the sheet's missing 200 °F column
  ] as const)('%s at %d °F = %d psi', (id, tempF, psi, fromMemory) => {
    const r = allowableStressAt(get(id), tempF);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value).toBeCloseTo(psi, 6);
    expect(r.fromMemory).toBe(fromMemory);
    expect(r.source).toContain('B31.3 Table A-1');
    if (fromMemory) expect(r.source).toContain('from memory, verify against the licensed edition');
  });

  it('notes the gap where the A335 source omits the 200 °F column', () => {
    const r = allowableStressAt(get('A335-P22'), 200);
    expect(r.ok && r.source).toContain('200 °F column');
  });

  it('refuses temperatures above the table and names the range (never extrapolates)', () => {
    const r = allowableStressAt(get('A106-B'), 1100); // carbon-steel line ends at 1000 °F
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.reason).toContain('1000 °F');
      expect(r.reason).toContain('above');
    }
    expect(allowableStressAt(get('A312-TP316'), 1201).ok).toBe(false); // TP316 row ends at 1200 °F
  });

  it('refuses temperatures below the minimum without impact testing', () => {
    const r = allowableStressAt(get('A333-6'), -60); // A333 Gr 6 minimum −50 °F, product sheets
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/minimum temperature -50 °F/);
    expect(allowableStressAt(get('A312-TP304'), -425).ok).toBe(true); // B31.3 accepts TP304 to −425 °F (A312 note)
    expect(allowableStressAt(get('A312-TP304'), -426).ok).toBe(false);
  });

  it('rejects a non-numeric temperature as a result, not an exception', () => {
    expect(allowableStressAt(get('A106-B'), Number.NaN).ok).toBe(false);
  });

  it('A53 B ERW uses the same S row as seamless (E comes from the product form)', () => {
    const a53 = get('A53-B');
    expect(a53.productForms).toEqual(expect.arrayContaining(['seamless', 'erw']));
    expect(a53.stress).toEqual(get('A106-B').stress);
  });
});

describe('yield strength Sy (provisional, from memory)', () => {
  it.each([
    ['A106-B', 100, 35_000], // provisional SA-106 B row, from memory
    ['A106-B', 650, 25_500], // provisional SA-106 B row, from memory
    ['A312-TP304', 1000, 15_500], // provisional 304 row, from memory
    ['A312-TP316', 300, 23_400], // provisional 316 row, from memory
    ['A312-TP316', 250, 24_650], // interpolated between 200 and 300 °F of the provisional 316 row
  ] as const)('%s at %d °F = %d psi, flagged from memory', (id, tempF, psi) => {
    const r = yieldStrengthAt(get(id), tempF);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value).toBeCloseTo(psi, 6);
    expect(r.fromMemory).toBe(true);
    expect(r.source).toContain('from memory, verify against the licensed edition');
  });
  it('reports materials without a yield table instead of borrowing another row', () => {
    for (const id of ['A312-TP304L', 'A312-TP316L', 'A312-TP321', 'A335-P91', 'A53-B']) {
      const r = yieldStrengthAt(get(id), 400);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.reason).toContain('no yield-versus-temperature table');
    }
  });
  it('refuses the SA-106 B row above 700 °F, its last tabulated temperature', () => {
    expect(yieldStrengthAt(get('A106-B'), 800).ok).toBe(false);
  });
});

describe('elastic modulus, B31.3-2010 Table C-6 / B31.1-1995 values', () => {
  it.each([
    ['carbon', 70, 29.5e6], // Table C-6, carbon steel C ≤ 0.3 %
    ['carbon', 1000, 20.4e6], // Table C-6
    ['carbon', 135, 29.15e6], // interpolated 70–200 °F
    ['austenitic', 70, 28.3e6], // Table C-6
    ['austenitic', 1200, 21.2e6], // Table C-6
    ['cr-mo-low', 800, 25.5e6], // Table C-6, Cr-Mo ½–2 %
    ['cr-mo-2-1/4', -325, 32.6e6], // Table C-6, Cr-Mo 2¼–3 %
    ['cr-mo-5-9', 1100, 20.4e6], // Table C-6, Cr-Mo 5–9 %
  ] as const)('%s at %d °F = %d psi', (group, tempF, psi) => {
    const r = elasticModulusAt(group as ModulusGroup, tempF);
    expect(okValue(r)).toBeCloseTo(psi, 0);
    expect(r.ok && r.source).toContain('Table C-6');
  });
  it('refuses temperatures above the group table', () => {
    expect(elasticModulusAt('carbon', 1200).ok).toBe(false); // carbon steel column ends at 1100 °F
  });
});

describe('findMaterial spellings', () => {
  it.each([
    ['A106-B', 'A106-B'],
    ['a106 b', 'A106-B'],
    ['A106 Gr B', 'A106-B'],
    ['A106 Gr. B', 'A106-B'],
    ['ASTM A106 Grade B', 'A106-B'],
    ['SA-106 B', 'A106-B'],
    ['SA106B', 'A106-B'],
    ['API 5L Gr. B', 'API5L-B'],
    ['A333 Gr 6', 'A333-6'],
    ['A335 P91', 'A335-P91'],
    ['P11', 'A335-P11'],
    ['A312-TP316L', 'A312-TP316L'],
    ['SA-312 TP316L', 'A312-TP316L'],
    ['A312 Type 316L', 'A312-TP316L'],
    ['316L', 'A312-TP316L'],
    ['tp304', 'A312-TP304'],
  ])('%s → %s', (input, id) => {
    expect(findMaterial(input)?.id).toBe(id);
  });
  it.each(['', 'B', '6', 'A106', 'A106-C', 'unobtainium', '316H'])(
    '%j is unknown or ambiguous',
    (input) => {
      expect(findMaterial(input)).toBeUndefined();
    },
  );
});

describe('createMaterialLookup', () => {
  const team: Material = {
    id: 'TEAM-316L-PLATE',
    spec: 'ASTM A240',
    grade: '316L',
    name: 'Team plate material (test fixture)',
    category: 'austenitic',
    tensilePsi: 70_000,
    yieldPsi: 25_000,
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: ['efw-double'],
    stress: [{ tempF: 100, value: 16_700 }],
    source: 'test fixture',
    notes: [],
  };
  const override: Material = {
    ...get('A106-B'),
    source: 'team override fixture',
    stress: [{ tempF: 100, value: 19_000 }],
  };
  const find = createMaterialLookup([team, override]);

  it('searches the extra materials first', () => {
    expect(find('A106-B')?.source).toBe('team override fixture');
    expect(find('TEAM-316L-PLATE')).toBe(team);
    expect(find('A240 316L')).toBe(team);
    expect(find('A312-TP316L')?.id).toBe('A312-TP316L');
  });
  it('drops a bare grade that became ambiguous', () => {
    expect(find('316L')).toBeUndefined();
    expect(findMaterial('316L')?.id).toBe('A312-TP316L'); // the library lookup is unchanged
  });
});
