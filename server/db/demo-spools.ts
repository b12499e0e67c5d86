import type { Direction, SpoolDocument, SpoolElement } from '../../shared/model/spool';

/**
 * Demo spools of an invented plant: one passes, one is marginal, one fails, and one passes as
 * drawn but its bends must be ordered heavier before bending. Each run alternates straights and 90° bends; a bend's
 * `direction` is the run's direction after it, so the sketch is coherent.
 */

type Leg = { direction: Direction; length: number };

function buildRun(
  prefix: string,
  legs: readonly Leg[],
  pipe: { nps: string; schedule: string },
  bendRadius: { multipleOfD: number },
): SpoolElement[] {
  const out: SpoolElement[] = [];
  legs.forEach((leg, i) => {
    if (i > 0) {
      out.push({
        kind: 'bend',
        id: `${prefix}-B${i}`,
        ...pipe,
        bendRadius,
        angle: 90,
        direction: leg.direction,
      });
    }
    out.push({
      kind: 'straight',
      id: `${prefix}-S${i + 1}`,
      ...pipe,
      direction: leg.direction,
      length: leg.length,
      endType: 'bevel',
    });
  });
  return out;
}

/** A spool of `count` elements (straights and bends in turn), for benchmarks and load tests. */
export function buildLongSpool(count: number, name = `Long run ${count}`): SpoolDocument {
  const dirs: Direction[] = ['east', 'north', 'up', 'west', 'south', 'down'];
  const legs: Leg[] = [];
  const legCount = Math.ceil((count + 1) / 2);
  for (let i = 0; i < legCount; i++)
    legs.push({ direction: dirs[i % dirs.length]!, length: 36 + (i % 5) * 6 });
  const elements = buildRun('L', legs, { nps: '4', schedule: '40' }, { multipleOfD: 3 }).slice(
    0,
    count,
  );
  return {
    units: 'imperial',
    name,
    line: '4"-HW-9000-A1',
    conditions: {
      pressure: 150,
      temperature: 200,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    elements,
  };
}

export const DEMO_SPOOLS: readonly SpoolDocument[] = [
  {
    units: 'imperial',
    name: 'CW-101-01 Cooling water header drop',
    line: '4"-CW-1012-A1',
    conditions: {
      pressure: 150,
      temperature: 120,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 3 },
    elements: buildRun(
      'CW',
      [
        { direction: 'east', length: 48 },
        { direction: 'down', length: 30 },
        { direction: 'north', length: 60 },
      ],
      { nps: '4', schedule: '40' },
      { multipleOfD: 3 },
    ),
  },
  {
    units: 'imperial',
    name: 'SV-204-03 Solvent transfer to day tank',
    line: '2"-SV-2040-S2',
    conditions: {
      pressure: 1250,
      temperature: 300,
      material: 'A312-TP316L',
      corrosionAllowance: 0,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 5 },
    elements: buildRun(
      'SV',
      [
        { direction: 'north', length: 40 },
        { direction: 'up', length: 24 },
        { direction: 'west', length: 36 },
      ],
      { nps: '2', schedule: '10S' },
      { multipleOfD: 5 },
    ),
  },
  {
    units: 'imperial',
    name: 'HP-310-02 Boiler feed discharge',
    line: '6"-BF-3102-C3',
    conditions: {
      pressure: 1900,
      temperature: 400,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 3 },
    elements: buildRun(
      'BF',
      [
        { direction: 'south', length: 72 },
        { direction: 'east', length: 48 },
      ],
      { nps: '6', schedule: '40' },
      { multipleOfD: 3 },
    ),
  },
  {
    units: 'imperial',
    name: 'ST-415-01 Steam supply to reboiler',
    line: '3"-ST-4150-B1',
    conditions: {
      pressure: 1100,
      temperature: 450,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 3 },
    elements: buildRun(
      'ST',
      [
        { direction: 'west', length: 54 },
        { direction: 'north', length: 42 },
        { direction: 'up', length: 36 },
      ],
      { nps: '3', schedule: '40' },
      { multipleOfD: 3 },
    ),
  },
];
