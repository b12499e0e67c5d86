import { describe, expect, it } from 'vitest';
import {
  NPS_SIZES,
  SCHEDULES,
  getPipeSize,
  getPipeWall,
  listPipeWalls,
  normalizeNps,
  normalizeSchedule,
  npsToNumber,
  type PipeStandard,
} from '@shared/data/pipe-dimensions';

const B10 = 'ASME B36.10M Table 1';
const B19 = 'ASME B36.19M Table 1';

describe('outside diameters', () => {
  // [nps, standard, dn, odIn, odMm, source]
  const cases: [string, PipeStandard, number, number, number, string][] = [
    ['1/8', 'B36.10M', 6, 0.405, 10.3, B10],
    ['1/2', 'B36.10M', 15, 0.84, 21.3, B10],
    ['1', 'B36.10M', 25, 1.315, 33.4, B10],
    ['1-1/2', 'B36.10M', 40, 1.9, 48.3, B10],
    ['2', 'B36.10M', 50, 2.375, 60.3, B10],
    ['2-1/2', 'B36.10M', 65, 2.875, 73.0, B10],
    ['3-1/2', 'B36.10M', 90, 4.0, 101.6, B10],
    ['4', 'B36.10M', 100, 4.5, 114.3, B10],
    ['5', 'B36.10M', 125, 5.563, 141.3, B10],
    ['6', 'B36.10M', 150, 6.625, 168.3, B10],
    ['8', 'B36.10M', 200, 8.625, 219.1, B10],
    // NPS 10 and 12 metric ODs differ between the standards: ASME B36.10M vs B36.19M Table 1.
    ['10', 'B36.10M', 250, 10.75, 273.0, B10],
    ['12', 'B36.10M', 300, 12.75, 323.8, B10],
    ['10', 'B36.19M', 250, 10.75, 273.1, B19],
    ['12', 'B36.19M', 300, 12.75, 323.9, B19],
    ['14', 'B36.10M', 350, 14, 355.6, B10],
    ['18', 'B36.10M', 450, 18, 457, B10],
    ['24', 'B36.10M', 600, 24, 610, B10],
    ['30', 'B36.19M', 750, 30, 762, B19],
    ['48', 'B36.10M', 1200, 48, 1219, B10],
  ];
  it.each(cases)('NPS %s %s: DN %s, OD %s in / %s mm (%s)', (nps, std, dn, odIn, odMm) => {
    expect(getPipeSize(nps, std)).toEqual({ nps, npsValue: npsToNumber(nps), dn, odIn, odMm });
  });

  it('defaults to B36.10M', () => {
    expect(getPipeSize('10')?.odMm).toBe(273.0); // ASME B36.10M Table 1
  });

  it('B36.19M lists NPS 1/8 to 24 and 30 only', () => {
    // ASME B36.19M Table 1 (from memory): no NPS 26, 28 or 32 and above.
    expect(getPipeSize('30', 'B36.19M')).toBeDefined();
    for (const nps of ['26', '28', '32', '36', '48']) {
      expect(getPipeSize(nps, 'B36.19M')).toBeUndefined();
    }
  });

  it('returns undefined for sizes that are not NPS', () => {
    expect(getPipeSize('7')).toBeUndefined(); // no NPS 7 in ASME B36.10M
    expect(getPipeSize('50')).toBeUndefined(); // beyond the range these tables carry
  });
});

describe('walls', () => {
  // [nps, schedule, wallIn, wallMm, standard, source]
  const cases: [string, string, number, number, PipeStandard, string][] = [
    ['1/8', '40', 0.068, 1.73, 'B36.10M', B10],
    ['1/8', '10', 0.049, 1.24, 'B36.10M', B10],
    ['1/2', '80', 0.147, 3.73, 'B36.10M', B10],
    ['1/2', '160', 0.188, 4.78, 'B36.10M', B10],
    ['3/4', '40', 0.113, 2.87, 'B36.10M', B10],
    ['1', '40', 0.133, 3.38, 'B36.10M', B10],
    ['1-1/2', 'XXS', 0.4, 10.15, 'B36.10M', `${B10} (metric printed 10.15, not 10.16)`],
    ['2', '40', 0.154, 3.91, 'B36.10M', B10],
    ['2', '80', 0.218, 5.54, 'B36.10M', B10],
    ['2', '160', 0.344, 8.74, 'B36.10M', B10],
    ['3', '40', 0.216, 5.49, 'B36.10M', B10],
    ['4', '40', 0.237, 6.02, 'B36.10M', B10],
    ['4', '120', 0.438, 11.13, 'B36.10M', B10],
    ['6', '40', 0.28, 7.11, 'B36.10M', B10],
    ['6', '80', 0.432, 10.97, 'B36.10M', B10],
    ['8', '20', 0.25, 6.35, 'B36.10M', B10],
    ['8', '30', 0.277, 7.04, 'B36.10M', B10],
    ['8', '40', 0.322, 8.18, 'B36.10M', B10],
    ['10', '40', 0.365, 9.27, 'B36.10M', B10],
    ['12', '40', 0.406, 10.31, 'B36.10M', B10],
    ['12', 'STD', 0.375, 9.53, 'B36.10M', B10],
    ['12', 'XXS', 1.0, 25.4, 'B36.10M', B10],
    ['14', '10', 0.25, 6.35, 'B36.10M', B10],
    ['16', '40', 0.5, 12.7, 'B36.10M', B10],
    ['20', '20', 0.375, 9.53, 'B36.10M', B10],
    ['24', '40', 0.688, 17.48, 'B36.10M', B10],
    ['24', '160', 2.344, 59.54, 'B36.10M', B10],
    ['36', '40', 0.75, 19.05, 'B36.10M', B10],
    ['48', 'XS', 0.5, 12.7, 'B36.10M', B10],
    ['1/2', '5S', 0.065, 1.65, 'B36.19M', B19],
    ['2', '10S', 0.109, 2.77, 'B36.19M', B19],
    ['4', '5S', 0.083, 2.11, 'B36.19M', B19],
    ['10', '40S', 0.365, 9.27, 'B36.19M', B19],
    ['12', '40S', 0.375, 9.53, 'B36.19M', `${B19} (40S = STD, not Sch 40)`],
    ['12', '80S', 0.5, 12.7, 'B36.19M', B19],
    ['14', '10S', 0.188, 4.78, 'B36.19M', `${B19} (differs from B36.10M Sch 10, 0.250 in)`],
    ['24', '10S', 0.25, 6.35, 'B36.19M', B19],
    ['30', '5S', 0.25, 6.35, 'B36.19M', B19],
    ['30', '10S', 0.312, 7.92, 'B36.19M', B19],
  ];
  it.each(cases)('NPS %s Sch %s: %s in / %s mm, %s (%s)', (nps, sch, wallIn, wallMm, std) => {
    const wall = getPipeWall(nps, sch);
    const size = getPipeSize(nps, std);
    expect(wall).toEqual({
      nps,
      schedule: sch,
      standard: std,
      odIn: size?.odIn,
      odMm: size?.odMm,
      wallIn,
      wallMm,
      source: expect.stringContaining(std) as unknown,
    });
  });

  it('carries the OD of its own standard (NPS 10: 273.0 mm B36.10M, 273.1 mm B36.19M)', () => {
    // ASME B36.10M and B36.19M Table 1 metric columns.
    expect(getPipeWall('10', '40')?.odMm).toBe(273.0);
    expect(getPipeWall('10', '40S')?.odMm).toBe(273.1);
    expect(getPipeWall('12', 'STD')?.odMm).toBe(323.8);
    expect(getPipeWall('12', '10S')?.odMm).toBe(323.9);
  });

  // Combinations the standards leave blank (ASME B36.10M / B36.19M Table 1, from memory).
  const unlisted: [string, string][] = [
    ['3-1/2', 'XXS'],
    ['22', '40'],
    ['26', '40'],
    ['26', '30'],
    ['5', '30'],
    ['6', '20'],
    ['1/4', '160'],
    ['3-1/2', '160'],
    ['38', '10'],
    ['38', '40'],
    ['14', 'XXS'],
    ['1/8', '5S'],
    ['22', '40S'],
    ['30', '80S'],
    ['26', '10S'],
  ];
  it.each(unlisted)('NPS %s Sch %s is not listed', (nps, sch) => {
    expect(getPipeWall(nps, sch)).toBeUndefined();
  });

  it('rejects unknown sizes and schedules', () => {
    expect(getPipeWall('7', '40')).toBeUndefined(); // no NPS 7 (ASME B36.10M)
    expect(getPipeWall('2', '5')).toBeUndefined(); // Sch 5 is not a B36.10M schedule
    expect(getPipeWall('2', '45')).toBeUndefined(); // no such schedule
  });

  it('accepts non-canonical spellings', () => {
    // NPS 1-1/2 Sch 80: 0.200 in (ASME B36.10M Table 1).
    expect(getPipeWall('1.5', 'sch 80')?.wallIn).toBe(0.2);
    expect(getPipeWall('1 1/2', '80')?.schedule).toBe('80');
  });
});

describe('STD, XS and the S schedules (ASME B36.10M / B36.19M Table 1)', () => {
  const index = (nps: string) => NPS_SIZES.indexOf(nps);

  it.each(NPS_SIZES)('NPS %s STD: Sch 40 up to NPS 10, then 0.375 in', (nps) => {
    const std = getPipeWall(nps, 'STD');
    expect(std).toBeDefined();
    if (index(nps) <= index('10')) expect(std?.wallIn).toBe(getPipeWall(nps, '40')?.wallIn);
    else expect(std?.wallIn).toBe(0.375);
  });

  it.each(NPS_SIZES)('NPS %s XS: Sch 80 up to NPS 8, then 0.500 in', (nps) => {
    const xs = getPipeWall(nps, 'XS');
    expect(xs).toBeDefined();
    if (index(nps) <= index('8')) expect(xs?.wallIn).toBe(getPipeWall(nps, '80')?.wallIn);
    else expect(xs?.wallIn).toBe(0.5);
  });

  it('40S = STD and 80S = XS wherever listed', () => {
    let listed = 0;
    for (const nps of NPS_SIZES) {
      const s40 = getPipeWall(nps, '40S');
      const s80 = getPipeWall(nps, '80S');
      if (s40) {
        listed += 1;
        expect(s40.wallIn).toBe(getPipeWall(nps, 'STD')?.wallIn);
      }
      if (s80) expect(s80.wallIn).toBe(getPipeWall(nps, 'XS')?.wallIn);
    }
    // ASME B36.19M Table 1 lists 40S at NPS 1/8-20 and 24: 23 sizes.
    expect(listed).toBe(23);
  });

  it('10S equals B36.10M Sch 10 up to NPS 12', () => {
    // ASME B36.10M / B36.19M Table 1: identical light walls NPS 1/8 through 12.
    for (const nps of NPS_SIZES.slice(0, index('12') + 1)) {
      expect(getPipeWall(nps, '10S')?.wallIn).toBe(getPipeWall(nps, '10')?.wallIn);
    }
  });
});

describe('table consistency', () => {
  const all = NPS_SIZES.flatMap((nps) => listPipeWalls(nps));

  it('holds every entry once, 267 B36.10M and 93 B36.19M', () => {
    // Counted from ASME B36.10M / B36.19M Table 1 as carried (cross-checked against fluids).
    expect(all.filter((w) => w.standard === 'B36.10M')).toHaveLength(267);
    expect(all.filter((w) => w.standard === 'B36.19M')).toHaveLength(93);
    expect(new Set(all.map((w) => `${w.nps}|${w.schedule}`)).size).toBe(all.length);
  });

  it('metric walls are the inch walls × 25.4 to the printed 0.01 mm', () => {
    // Common practice of both standards: metric column = in × 25.4 rounded to 0.01 mm,
    // with a few printed one count off (NPS 1-1/2 XXS 10.15 mm).
    for (const w of all) expect(Math.abs(w.wallIn * 25.4 - w.wallMm)).toBeLessThanOrEqual(0.011);
  });

  it('numbered schedules get thicker with the schedule number at every NPS', () => {
    // Common practice: B36.10M schedule numbers rise with wall at a given NPS.
    for (const nps of NPS_SIZES) {
      const numbered = SCHEDULES.filter((s) => /^\d+$/.test(s))
        .map((s) => getPipeWall(nps, s)?.wallIn)
        .filter((v): v is number => v !== undefined);
      for (let i = 1; i < numbered.length; i++) {
        expect(numbered[i]).toBeGreaterThan(numbered[i - 1] ?? Infinity);
      }
    }
  });

  it('walls are thinner than the radius', () => {
    for (const w of all) expect(w.wallIn).toBeLessThan(w.odIn / 2); // geometry
  });

  it('NPS_SIZES is ascending from 1/8 to 48', () => {
    const values = NPS_SIZES.map(npsToNumber);
    expect(NPS_SIZES[0]).toBe('1/8');
    expect(NPS_SIZES.at(-1)).toBe('48');
    expect(NPS_SIZES).toHaveLength(36);
    expect([...values].sort((a, b) => a - b)).toEqual(values);
  });

  it('SCHEDULES lists the B36.10M then B36.19M designations', () => {
    expect(SCHEDULES).toEqual([
      '10', '20', '30', '40', '60', '80', '100', '120', '140', '160',
      'STD', 'XS', 'XXS', '5S', '10S', '40S', '80S',
    ]); // prettier-ignore
  });
});

describe('listPipeWalls', () => {
  it('sorts NPS 10 by wall with ties numbered, then STD/XS/XXS, then S', () => {
    // Walls from ASME B36.10M / B36.19M Table 1: 5S 0.134, 10 = 10S 0.165, 20 0.250,
    // 30 0.307, 40 = STD = 40S 0.365, 60 = XS = 80S 0.500, 80 0.594, 100 0.719,
    // 120 0.844, 140 = XXS 1.000, 160 1.125.
    expect(listPipeWalls('10').map((w) => w.schedule)).toEqual([
      '5S', '10', '10S', '20', '30', '40', 'STD', '40S', '60', 'XS', '80S', '80', '100',
      '120', '140', 'XXS', '160',
    ]); // prettier-ignore
  });

  it('lists NPS 2 in order', () => {
    // ASME B36.10M / B36.19M Table 1: 5S 0.065, 10 = 10S 0.109, 30 0.125,
    // 40 = STD = 40S 0.154, 80 = XS = 80S 0.218, 160 0.344, XXS 0.436.
    expect(listPipeWalls('2').map((w) => w.schedule)).toEqual([
      '5S', '10', '10S', '30', '40', 'STD', '40S', '80', 'XS', '80S', '160', 'XXS',
    ]); // prettier-ignore
  });

  it('lists only STD and XS at NPS 48', () => {
    expect(listPipeWalls('48').map((w) => w.schedule)).toEqual(['STD', 'XS']); // ASME B36.10M
  });

  it('is non-decreasing in wall for every NPS', () => {
    for (const nps of NPS_SIZES) {
      const walls = listPipeWalls(nps).map((w) => w.wallIn);
      expect(walls.length).toBeGreaterThan(0);
      expect([...walls].sort((a, b) => a - b)).toEqual(walls);
    }
  });

  it('returns a fresh array and [] for an unknown NPS', () => {
    const first = listPipeWalls('4');
    first.pop();
    expect(listPipeWalls('4')).toHaveLength(first.length + 1);
    expect(listPipeWalls('7')).toEqual([]);
  });
});

describe('normalizeNps', () => {
  const cases: [string | number, string | undefined][] = [
    ['1-1/2', '1-1/2'],
    ['1 1/2', '1-1/2'],
    ['1.5', '1-1/2'],
    [1.5, '1-1/2'],
    ['NPS 2', '2'],
    ['nps2', '2'],
    ['2"', '2'],
    ['2 in', '2'],
    [' 3/4 ', '3/4'],
    ['0.75', '3/4'],
    ['.125', '1/8'],
    [0.125, '1/8'],
    ['1½', '1-1/2'],
    ['½', '1/2'],
    ['2-1/2', '2-1/2'],
    ['3 1/2', '3-1/2'],
    [10, '10'],
    ['48', '48'],
    ['7', undefined],
    [1.3, undefined],
    ['50', undefined],
    ['', undefined],
    ['abc', undefined],
    [Number.NaN, undefined],
    ['DN 50', undefined],
  ];
  it.each(cases)('%j → %j (common practice spellings)', (input, expected) => {
    expect(normalizeNps(input)).toBe(expected);
  });
});

describe('normalizeSchedule', () => {
  const cases: [string | number, string | undefined][] = [
    ['40', '40'],
    ['Sch 40', '40'],
    ['sch40', '40'],
    ['SCH. 80', '80'],
    ['Schedule 160', '160'],
    [40, '40'],
    ['std', 'STD'],
    ['Standard', 'STD'],
    ['xs', 'XS'],
    ['Extra Strong', 'XS'],
    ['XXS', 'XXS'],
    ['10s', '10S'],
    ['Sch 40S', '40S'],
    ['sch-5s', '5S'],
    ['5', undefined],
    ['45', undefined],
    ['', undefined],
    ['heavy', undefined],
  ];
  it.each(cases)('%j → %j (common practice spellings)', (input, expected) => {
    expect(normalizeSchedule(input)).toBe(expected);
  });
});

describe('npsToNumber', () => {
  it.each([
    ['1/8', 0.125],
    ['1-1/4', 1.25],
    ['3-1/2', 3.5],
    ['48', 48],
  ] as const)('%s → %s (definition of the NPS designation)', (nps, value) => {
    expect(npsToNumber(nps)).toBe(value);
  });
});
