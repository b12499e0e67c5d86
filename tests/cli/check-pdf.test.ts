import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CAUTION } from '@shared/model/caution';
import { runCheck } from '@shared/cli/check';
import { cliRunner, fileWriter, tempDir } from './run-cli';

const run = cliRunner('check');
const dir = tempDir('spoolwright-cli-pdf-');
const write = fileWriter(dir);
const pdfText = (file: string) =>
  execFileSync('pdftotext', [file, '-']).toString('utf8').replace(/\s+/g, ' ');

const base = {
  units: 'imperial',
  name: 'CLI sheet spool',
  line: 'L-77',
  conditions: { pressure: 285, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
};
const passing = {
  ...base,
  elements: [
    { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 40 },
    { id: 'B1', kind: 'bend', nps: '4', schedule: '40', bendRadius: { multipleOfD: 3 }, angle: 90 },
  ],
};
const failing = { ...passing, conditions: { ...base.conditions, pressure: 3000 } };

describe('npm run check -- --pdf out.pdf', () => {
  it('writes the calc sheet (no team, no history) and exits 0 for a passing spool', async () => {
    const out = join(dir, 'pass.pdf');
    const r = await run(['--pdf', out, write('pass.json', passing)]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('S1');
    expect(r.stderr).toContain(`calc sheet written to ${out}`);
    expect(readFileSync(out).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = pdfText(out);
    expect(text).toContain('CLI sheet spool · no revision');
    expect(text).toContain('Team — Spool CLI sheet spool Line L-77 Revision — State —');
    expect(text).toContain('Straight S1');
    expect(text).toContain('Bend B1');
    expect(text).toContain('No history: made by the headless checker');
    expect(text).toContain(CAUTION);
    expect(text).toMatch(/Page 1 of \d+/);
  });

  it('exits 1 for a failing spool and still writes the sheet with FAIL; --json keeps one JSON object on stdout', async () => {
    const out = join(dir, 'fail.pdf');
    const r = await run(['--json', `--pdf=${out}`, write('fail.json', failing)]);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout)).toHaveProperty('summary');
    expect(pdfText(out)).toContain('FAIL');
  });

  it('exits 2 for bad input without writing, for a missing file name, and for a path it cannot write', async () => {
    const out = join(dir, 'bad.pdf');
    const bad = await run([
      '--pdf',
      out,
      write('bad.json', {
        ...base,
        elements: [{ id: 'B', kind: 'bend', nps: '4', schedule: '40', angle: 90 }],
      }),
    ]);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('elements[0].bendRadius');
    expect(existsSync(out)).toBe(false);

    const noName = runCheck(['--pdf'], () => '{}');
    expect(noName.code).toBe(2);
    expect(noName.stderr).toContain('--pdf needs a file name');

    const unwritable = await run([
      '--pdf',
      join(dir, 'no-such-dir', 'x.pdf'),
      write('pass2.json', passing),
    ]);
    expect(unwritable.code).toBe(2);
    expect(unwritable.stderr).toContain('cannot write the calc sheet');
  });
});
