import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { runShop } from '@shared/cli/shop';
import { cliRunner, fileWriter, tempDir } from './run-cli';

const run = cliRunner('shop');
const dir = tempDir('spoolwright-shop-');
const write = fileWriter(dir);

// NPS 4 Sch 40 (4.500 × 0.237 in, ASME B36.10M), A106 B at 500 °F: ST/S = 20.0/18.9 (B31.3 Table A-1).
const spool = {
  units: 'imperial',
  name: 'CLI test',
  conditions: { pressure: 200, temperature: 500, material: 'A106-B' },
  elements: [
    { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 48 },
    { id: 'B1', kind: 'bend', nps: '4', schedule: '40', bendRadius: { multipleOfD: 3 }, angle: 90 },
    { id: 'S2', kind: 'straight', nps: '4', schedule: '40', length: 36 },
  ],
};

describe('npm run shop (process)', () => {
  it('--json prints one object in the documented shape, exit 0', async () => {
    const r = await run(['--json', write('spool.json', spool)]);
    expect(r.code).toBe(0);
    expect(r.stdout.trim().split('\n')).toHaveLength(1);
    const out = JSON.parse(r.stdout) as {
      units: string;
      elements: {
        id: string;
        cutLength: number;
        mass: number;
        bend?: { arcLength: number; tangent: number };
      }[];
      bom: { nps: string; schedule: string; length: number }[];
      welds: number;
      developedLength: number;
      totalMass: number;
      filledMass: number;
      hydrotest: {
        pressure: number;
        ratio: number;
        governing: string;
        limitedBy: string | null;
        equation: string;
      };
    };
    expect(out.units).toBe('imperial');
    expect(out.elements.map((e) => e.id)).toEqual(['S1', 'B1', 'S2']);
    expect(out.elements[1]!.bend!.arcLength).toBeCloseTo(6 * Math.PI, 9); // R = 3 × 4 in, θ = π/2
    expect(out.elements[1]!.bend!.tangent).toBeCloseTo(12, 9); // 12 × tan 45°
    expect(out.welds).toBe(2);
    expect(out.developedLength).toBeCloseTo(84 + 6 * Math.PI, 9);
    // 10.69·(D − t)·t lb/ft (B36.10M plain-end formula) × developed length in ft.
    expect(out.totalMass).toBeCloseTo((10.69 * (4.5 - 0.237) * 0.237 * (84 + 6 * Math.PI)) / 12, 0);
    expect(out.filledMass).toBeGreaterThan(out.totalMass);
    expect(out.hydrotest.pressure).toBeCloseTo(1.5 * 200 * (20.0 / 18.9), 6);
    expect(out.hydrotest.governing).toBe('S1');
    expect(out.hydrotest.limitedBy).toBeNull();
  });
  it('--csv=cut-list prints a CSV with units in the header; reads "-" from stdin', async () => {
    const r = await run(['--csv=cut-list', '-'], JSON.stringify(spool));
    expect(r.code).toBe(0);
    const parsed = Papa.parse<Record<string, string>>(r.stdout.trim(), { header: true });
    expect(parsed.meta.fields).toContain('cut length (in)');
    expect(parsed.data.map((row) => row.element)).toEqual(['S1', 'B1', 'S2']);
    expect(Number(parsed.data[0]!['cut length (in)'])).toBe(48);
  });
  it('--csv prints the sheet per element, bend figures included', async () => {
    const r = await run(['--csv', write('csv.json', spool)]);
    expect(r.code).toBe(0);
    const parsed = Papa.parse<Record<string, string>>(r.stdout.trim(), { header: true });
    expect(parsed.meta.fields).toEqual(
      expect.arrayContaining([
        'order schedule',
        'wall before bending (in)',
        'extrados wall after bending (in)',
        'mass (lb)',
      ]),
    );
    const bend = parsed.data.find((row) => row.element === 'B1')!;
    expect(Number(bend['table factor'])).toBe(1.25); // B31.1 Table 102.4.5 at 3D
    expect(Number(bend['bend tangent R·tan(θ/2) (in)'])).toBe(12);
  });
  it('the readable sheet names the lists, the hydrotest and the caution', async () => {
    const r = await run([write('readable.json', spool)]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Bend list');
    expect(r.stdout).toContain('Cut list');
    expect(r.stdout).toContain('Bill of materials');
    expect(r.stdout).toMatch(/Hydrotest at 70 °F: 317\.5 psi/);
    expect(r.stdout).toContain('qualified engineer');
  });
  it('exit 2 naming the field for a bad document', async () => {
    const bad = {
      ...spool,
      elements: [{ id: 'B', kind: 'bend', nps: '4', schedule: '40', angle: 90 }],
    };
    const r = await run(['--json', write('bad.json', bad)]);
    expect(r.code).toBe(2);
    expect(JSON.parse(r.stdout)).toMatchObject({ error: { code: 'invalid_input' } });
    expect(r.stderr).toContain('elements[0].bendRadius');
  });
});

describe('runShop arguments', () => {
  const read = () => JSON.stringify(spool);
  it('refuses unknown options, two modes and missing files with the usage', () => {
    expect(runShop(['--pdf', 'x.json'], read)).toMatchObject({ code: 2 });
    expect(runShop(['--json', '--csv', 'x.json'], read).stderr).toContain('not both');
    expect(runShop([], read).stderr).toContain('usage');
    expect(runShop(['--csv=weights', 'x.json'], read).stderr).toContain('unknown table');
  });
  it('names a shop setting that is out of range', () => {
    const r = runShop(['x.json'], () => JSON.stringify({ ...spool, shop: { bendTangent: -1 } }));
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('shop.bendTangent');
  });
  it('names an element the check cannot resolve', () => {
    const r = runShop(['x.json'], () =>
      JSON.stringify({
        ...spool,
        elements: [{ id: 'S9', kind: 'straight', nps: '4', schedule: '999', length: 1 }],
      }),
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('elements[0].schedule');
  });
  it('unreadable input and invalid JSON exit 2', () => {
    expect(
      runShop(['nope.json'], () => {
        throw new Error('ENOENT');
      }).stderr,
    ).toContain('cannot read nope.json');
    expect(runShop(['x.json'], () => '{').stderr).toContain('not valid JSON');
  });
});
