import { describe, expect, it } from 'vitest';
import { runCheck } from '@shared/cli/check';
import { cliRunner, fileWriter, tempDir } from './run-cli';

const run = cliRunner('check');
const dir = tempDir('spoolwright-cli-');
const write = fileWriter(dir);

const base = {
  units: 'imperial',
  conditions: { pressure: 285, temperature: 100, material: 'A106-B' },
};
const passing = {
  ...base,
  elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 40 }],
};
const failing = {
  ...base,
  conditions: { ...base.conditions, pressure: 3000 },
  elements: [
    { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 40 },
    {
      id: 'B1',
      kind: 'bend',
      nps: '4',
      schedule: '160',
      bendRadius: { multipleOfD: 5 },
      angle: 90,
    },
  ],
};

describe('headless checker process', () => {
  it('exit 0 and exactly one JSON object on stdout for a passing spool', async () => {
    const r = await run(['--json', write('pass.json', passing)]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(Object.keys(out)).toEqual(expect.arrayContaining(['units', 'elements', 'summary']));
    expect(r.stdout.trim().split('\n')).toHaveLength(1);
  });
  it('exit 1 when an element fails; readable table without --json', async () => {
    const r = await run([write('fail.json', failing)]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/S1\s+straight\s+NPS 4 \/ 40/);
    expect(r.stdout).toContain('FAIL');
    expect(r.stdout).toContain('qualified engineer');
  });
  it('reads stdin with "-" and exits 2 naming the field', async () => {
    const bad = {
      ...passing,
      elements: [{ id: 'B', kind: 'bend', nps: '4', schedule: '40', angle: 90 }],
    };
    const r = await run(['--json', '-'], JSON.stringify(bad));
    expect(r.code).toBe(2);
    expect(JSON.parse(r.stdout)).toMatchObject({ error: { code: 'invalid_input' } });
    expect(r.stderr).toContain('elements[0].bendRadius');
  });
});

describe('headless checker contract (in process)', () => {
  const check = (doc: unknown, args: string[] = ['--json', 'x.json']) =>
    runCheck(args, () => (typeof doc === 'string' ? doc : JSON.stringify(doc)));

  it('JSON shape per element matches the contract', () => {
    const r = check(failing);
    expect(r.code).toBe(1);
    const out = JSON.parse(r.stdout) as {
      units: string;
      elements: Record<string, unknown>[];
      summary: Record<string, number>;
    };
    expect(out.units).toBe('imperial');
    for (const e of out.elements) {
      for (const k of [
        'id',
        'kind',
        'status',
        'outsideDiameter',
        'nominalWall',
        'minimumWall',
        'requiredNominalWall',
        'governing',
        'lightestSchedule',
        'mawp',
        'cases',
        'messages',
      ]) {
        expect(e).toHaveProperty(k);
      }
      for (const c of e.cases as Record<string, unknown>[]) {
        expect(['straight', 'intrados', 'extrados', 'sidewall', 'external']).toContain(c.case);
        expect(typeof c.t).toBe('number');
        expect(typeof c.tm).toBe('number');
        expect(typeof c.equation).toBe('string');
      }
    }
    expect(out.elements[1]).toHaveProperty('preBendWall');
    expect(out.summary).toMatchObject({
      pass: expect.any(Number),
      marginal: expect.any(Number),
      fail: expect.any(Number),
      review: expect.any(Number),
    });
    expect(out.summary.fail).toBeGreaterThanOrEqual(1);
  });
  it('extra fields are ignored', () => {
    expect(
      check({ ...passing, colour: 'blue', elements: [{ ...passing.elements[0], paint: 'red' }] })
        .code,
    ).toBe(0);
  });
  it('exit 1 for review (para. 304.1.2(b) special consideration)', () => {
    const r = check({
      ...base,
      conditions: { ...base.conditions, pressure: 9000 },
      elements: [{ id: 'S', kind: 'straight', nps: '1', schedule: 'XXS', length: 5 }],
    });
    expect(r.code).toBe(1);
    expect((JSON.parse(r.stdout) as { summary: { review: number } }).summary.review).toBe(1);
  });
  it('exit 0 for marginal', () => {
    // NPS 2 Sch 40 at 285 psig with c = 0.116 in needs ordered ≈ 0.152 in against 0.154 in: < 10 % margin.
    const r = check({
      ...base,
      conditions: { ...base.conditions, corrosionAllowance: 0.116 },
      elements: [{ id: 'S', kind: 'straight', nps: '2', schedule: '40', length: 5 }],
    });
    expect((JSON.parse(r.stdout) as { elements: { status: string }[] }).elements[0]?.status).toBe(
      'marginal',
    );
    expect(r.code).toBe(0);
  });
  it.each([
    ['not json', '{', /not valid JSON/],
    ['wrong kind', { ...passing, elements: [{ id: 'x', kind: 'elbow' }] }, /elements\[0\]\.kind/],
    ['missing conditions', { units: 'imperial', elements: [] }, /conditions/],
  ])('exit 2 on %s', (_name, doc, pattern) => {
    const r = check(doc);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(pattern);
  });
  it('exit 2 on usage errors', () => {
    expect(runCheck([], () => '').code).toBe(2);
    expect(runCheck(['--yaml', 'a.json'], () => '').code).toBe(2);
  });
});

describe('checker table: lightest schedule, external pressure, material vs spool stress (in-process)', () => {
  const doc = {
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
      { id: 'S1', kind: 'straight', nps: '2', schedule: '10', length: 40 },
      {
        id: 'S2',
        kind: 'straight',
        nps: '2',
        schedule: '80',
        length: 40,
        conditions: { material: 'A312-TP316L' },
      },
    ],
  };
  const result = runCheck(['spool.json'], () => JSON.stringify(doc));

  it('names both schedule names of an equal wall and the standard (ASME B36.10M: NPS 2 Sch 80 = XS)', () => {
    expect(result.stdout).toMatch(/S1 .*80 \/ XS \(B36\.10M\)/);
  });
  it('prints both external-pressure values and which governs, labelled from memory (UG-28 / VIII-2 4.4.5.1)', () => {
    expect(result.stdout).toContain('min(UG-28');
    expect(result.stdout).toContain('VIII-2 4.4.5.1');
    expect(result.stdout).toMatch(/governs/);
    expect(result.stdout).toContain('from memory');
  });
  it('prints the material-vs-spool-stress warning under the element that overrides its material', () => {
    const lines = result.stdout.split('\n');
    const at = lines.findIndex((l) => l.startsWith('S2 '));
    const below = lines.slice(at + 1, at + 8).join('\n');
    expect(below).toContain(
      "warning: this element's material A312-TP316L differs from the spool's",
    );
  });
  it('the JSON carries the structured choice and the message code', () => {
    const json = runCheck(['--json', 'spool.json'], () => JSON.stringify(doc));
    const check = JSON.parse(json.stdout) as {
      elements: {
        lightest: { names: string[]; standard: string };
        messages: { code: string }[];
        cases: {
          case: string;
          allowableUg28?: number;
          allowableVIII2?: number;
          allowableBasis?: string;
        }[];
      }[];
    };
    expect(check.elements[0]?.lightest).toMatchObject({ names: ['80', 'XS'], standard: 'B36.10M' });
    expect(check.elements[1]?.messages.map((m) => m.code)).toContain('material-vs-spool-stress');
    const ext = check.elements[0]?.cases.find((c) => c.case === 'external');
    expect(ext?.allowableUg28).toBeGreaterThan(0);
    expect(ext?.allowableVIII2).toBeGreaterThan(0);
    expect(ext?.allowableBasis).toMatch(/ug28|viii2/);
  });
});
