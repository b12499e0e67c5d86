import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import { checkSpool, type ElementCheck } from '@shared/engine/index';
import { getPipeWall, listScheduleChoices, scheduleStandard } from '@shared/data/pipe-dimensions';

// Source for every expectation here: the scope of the dimension standards — ASME B36.10M lists
// schedules 10…160 and the weights STD, XS, XXS; ASME B36.19M lists 5S, 10S, 40S, 80S. The
// candidates for "lightest schedule" are the element's own standard; stainless pipe is also made
// to B36.10M walls, so a stainless element with no passing S schedule is offered a B36.10M wall.
// Walls quoted are the B36.10M/B36.19M table values the engine holds (cross-checked elsewhere).

const doc = (
  conditions: Partial<SpoolDocument['conditions']>,
  el: SpoolElement,
): SpoolDocument => ({
  units: 'imperial',
  conditions: { pressure: 0, temperature: 100, ...conditions },
  elements: [el],
});
const only = (d: SpoolDocument): ElementCheck => {
  const e = checkSpool(d).elements[0];
  if (!e) throw new Error('no result');
  return e;
};
const straight = (nps: string, schedule: string): SpoolElement => ({
  id: 'S1',
  kind: 'straight',
  nps,
  schedule,
  length: 10,
});

describe('which standard a schedule belongs to (B36.10M / B36.19M scope)', () => {
  it.each([
    ['10', 'B36.10M'],
    ['40', 'B36.10M'],
    ['160', 'B36.10M'],
    ['STD', 'B36.10M'],
    ['XS', 'B36.10M'],
    ['XXS', 'B36.10M'],
    ['5S', 'B36.19M'],
    ['10S', 'B36.19M'],
    ['40S', 'B36.19M'],
    ['80S', 'B36.19M'],
  ])('%s is %s (a trailing S alone says nothing: XS and XXS are B36.10M weights)', (s, std) => {
    expect(scheduleStandard(s)).toBe(std);
  });

  it('equal walls of one standard are one choice naming both: NPS 2 "80 / XS", NPS 4 "40 / STD" (B36.10M: XS = 80 to NPS 8, STD = 40 to NPS 10)', () => {
    const labels = listScheduleChoices('2', 'B36.10M').map((c) => c.names.join(' / '));
    expect(labels).toContain('80 / XS');
    expect(labels).toContain('40 / STD');
    expect(listScheduleChoices('2', 'B36.10M').every((c) => c.standard === 'B36.10M')).toBe(true);
    expect(listScheduleChoices('2', 'B36.19M').map((c) => c.schedule)).toEqual([
      '5S',
      '10S',
      '40S',
      '80S',
    ]);
    // Above NPS 8 XS is 0.500 in and no longer equals Sch 80 (B36.10M).
    expect(
      listScheduleChoices('10', 'B36.10M').some(
        (c) => c.names.includes('XS') && c.names.includes('80'),
      ),
    ).toBe(false);
  });

  it('the resolve-time message names B36.10M for XS/XXS and B36.19M for S schedules', () => {
    const xxs = only(doc({ pressure: 100, material: 'A106-B' }, straight('1/4', 'XXS')));
    expect(xxs.status).toBe('invalid');
    expect(xxs.inputIssues[0]?.message).toContain('ASME B36.10M');
    const s5 = only(doc({ pressure: 100, material: 'A106-B' }, straight('1/8', '5S')));
    expect(s5.inputIssues[0]?.message).toContain('ASME B36.19M');
  });
});

describe("lightest passing schedule of the element's own standard", () => {
  it('NPS 5 XXS carbon-steel bend at 72 psi → 10 (B36.10M), not the B36.19M 5S', () => {
    const e = only(
      doc(
        { pressure: 72, material: 'A106-B' },
        {
          id: 'B1',
          kind: 'bend',
          nps: '5',
          schedule: 'XXS',
          bendRadius: { multipleOfD: 5 },
          angle: 90,
        },
      ),
    );
    expect(e.lightestSchedule).toBe('10');
    expect(e.lightest?.standard).toBe('B36.10M');
  });

  it('NPS 1 XS → 10 (B36.10M), not 10S', () => {
    const e = only(doc({ pressure: 100, material: 'A106-B' }, straight('1', 'XS')));
    expect(e.lightestSchedule).toBe('10');
    expect(e.lightest?.label).toBe('10 (ASME B36.10M)');
  });

  it('NPS 24 Sch 10 needing 0.411 in → XS (0.500 in), not 30 (0.562 in)', () => {
    const e = only(
      doc({ pressure: 500, material: 'A106-B', corrosionAllowance: 0.0625 }, straight('24', '10')),
    );
    expect(e.requiredNominalWall).toBeGreaterThan(0.375);
    expect(e.requiredNominalWall).toBeLessThan(0.5);
    expect(e.lightestSchedule).toBe('XS');
    expect(getPipeWall('24', 'XS')?.wallIn).toBe(0.5);
  });

  it('NPS 4 Sch 30 at 5,000 psi → XXS (0.674 in) where 160 (0.531 in) is short; before, "no listed schedule"', () => {
    const e = only(doc({ pressure: 5000, material: 'A106-B' }, straight('4', '30')));
    expect(e.status).toBe('fail');
    expect(e.requiredNominalWall).toBeGreaterThan(0.531);
    expect(e.requiredNominalWall).toBeLessThanOrEqual(0.674);
    expect(e.lightestSchedule).toBe('XXS');
    expect(e.messages.some((m) => m.code === 'no-schedule')).toBe(false);
  });

  it('NPS 4 Sch 30 at 2,800 psi → 120 (0.438 in), a numbered B36.10M schedule lighter than XXS', () => {
    const e = only(doc({ pressure: 2800, material: 'A106-B' }, straight('4', '30')));
    expect(e.lightestSchedule).toBe('120');
  });

  it('equal walls say both names: NPS 2 Sch 10 at 2,800 psi (needs 0.180 in) → "80 / XS" (0.218 in)', () => {
    const e = only(doc({ pressure: 2800, material: 'A106-B' }, straight('2', '10')));
    expect(e.lightestSchedule).toBe('80');
    expect(e.lightest?.names).toEqual(['80', 'XS']);
    expect(e.lightest?.label).toBe('80 / XS (ASME B36.10M)');
  });

  it('stainless 10S stays with S schedules while one passes: NPS 2 TP316L at 1,000 psi → 40S or 80S', () => {
    const e = only(doc({ pressure: 1000, material: 'A312-TP316L' }, straight('2', '10S')));
    expect(e.lightest?.standard).toBe('B36.19M');
    expect(['5S', '10S', '40S', '80S']).toContain(e.lightestSchedule);
  });

  it('stainless with no passing S schedule → the lightest passing B36.10M wall, labelled with its standard (NPS 2 TP316L at 3,000 psi → 160)', () => {
    const e = only(doc({ pressure: 3000, material: 'A312-TP316L' }, straight('2', '10S')));
    expect(e.requiredNominalWall).toBeGreaterThan(getPipeWall('2', '80S')?.wallIn ?? Infinity);
    expect(e.lightestSchedule).toBe('160');
    expect(e.lightest?.standard).toBe('B36.10M');
    expect(e.lightest?.label).toBe('160 (ASME B36.10M)');
  });

  it('carbon steel on a B36.10M schedule is never offered an S schedule, whatever the pressure', () => {
    for (const P of [10, 100, 500, 1000, 2000, 3000]) {
      const e = only(doc({ pressure: P, material: 'A106-B' }, straight('3', '40')));
      if (e.lightestSchedule !== null) expect(scheduleStandard(e.lightestSchedule)).toBe('B36.10M');
    }
  });

  it('review elements are offered a schedule too (numbers shown, status held): NPS 1/2 at 7,800 psi, t ≥ D/6 → 160', () => {
    const e = only(doc({ pressure: 7800, material: 'A106-B' }, straight('1/2', '40')));
    expect(e.status).toBe('review');
    expect(e.lightestSchedule).toBe('160');
  });

  it('the bend before-bending order is chosen by the same rule and names its standard', () => {
    const e = only(
      doc(
        { pressure: 1500, material: 'A106-B', corrosionAllowance: 0.05 },
        {
          id: 'B1',
          kind: 'bend',
          nps: '2',
          schedule: '80',
          bendRadius: { multipleOfD: 3 },
          angle: 90,
        },
      ),
    );
    expect(e.preBend?.order?.standard).toBe('B36.10M');
    if (e.preBend?.order) expect(e.preBend.orderSchedule).toBe(e.preBend.order.schedule);
  });
});
