/**
 * Cross-check of shared/data/pipe-dimensions.ts against an external reference: the pipe
 * schedule tables of the open-source `fluids` Python package (Debian: python3-fluids), which
 * tabulates ASME B36.10M-2004 and B36.19M-2004 in millimetres.
 *
 * Every entry our tables hold is compared (OD and wall, mm); entries one side has and the
 * other lacks are reported. Deliberate, reasoned deviations go in EXCEPTIONS below; a stale
 * exception (one that no longer differs) fails the test too.
 *
 * Tolerances, and why:
 * - Metric walls: both sides carry the standard's metric column, printed to 0.01 mm, so
 *   they should agree exactly; 0.006 mm allows float noise and half a count of the last
 *   printed digit, and stays well below 0.0254 mm, the effect of a 0.001 in typing slip.
 * - Inch walls × 25.4: fluids' 0.01 mm print rounds by up to 0.005 mm, and the standard
 *   prints a few metric walls one count off the exact conversion (0.400 in → 10.15 mm), so
 *   0.011 mm; still below 0.0254 mm, so a 0.001 in error in an inch wall is caught.
 * - Metric OD: same printed column on both sides → 0.006 mm (a 0.1 mm slip is caught).
 * - Inch OD × 25.4: the standards print metric ODs to 0.1 mm below NPS 14 (0.05 mm) and
 *   to whole mm from NPS 18 up (457 mm for 18.000 in = 457.2 mm), so 0.5 mm there.
 *
 * When fluids is not installed the suite is skipped with a warning, except in CI
 * (`process.env.CI` set), where it fails: CI installs python3-fluids.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  NPS_SIZES,
  SCHEDULES,
  getPipeWall,
  normalizeNps,
  npsToNumber,
  type PipeWall,
} from '@shared/data/pipe-dimensions';

interface FluidsEntry {
  nps: number;
  schedule: string;
  do_mm: number;
  t_mm: number;
}

type FluidsLoad =
  | { ok: true; python: string; version: string; entries: FluidsEntry[] }
  | { ok: false; reason: string };

const SCRIPT = fileURLToPath(new URL('../fluids/dump-fluids.py', import.meta.url));

/**
 * Pythons to try: FLUIDS_PYTHON alone when set (also a way to exercise the skip path),
 * otherwise Debian's interpreter, then whatever is on PATH (a pyenv python3 on PATH may not
 * see Debian's packages).
 */
const PYTHONS = process.env.FLUIDS_PYTHON
  ? [process.env.FLUIDS_PYTHON]
  : ['/usr/bin/python3', 'python3', 'python'];

function loadFluids(): FluidsLoad {
  const tried: string[] = [];
  for (const python of PYTHONS) {
    const probe = spawnSync(python, ['-c', 'import fluids'], { encoding: 'utf8', timeout: 30_000 });
    if (probe.status !== 0) {
      tried.push(
        `${python}: ${probe.error?.message ?? (probe.stderr.trim().split('\n').pop() || `exit ${probe.status}`)}`,
      );
      continue;
    }
    const run = spawnSync(python, [SCRIPT], { encoding: 'utf8', timeout: 60_000 });
    if (run.status !== 0) {
      return {
        ok: false,
        reason: `${python} ${SCRIPT} failed (exit ${run.status}): ${run.stderr || run.stdout}`,
      };
    }
    const parsed = JSON.parse(run.stdout) as { version: string; entries: FluidsEntry[] };
    return { ok: true, python, version: parsed.version, entries: parsed.entries };
  }
  return { ok: false, reason: `no python can import fluids (${tried.join('; ')})` };
}

/**
 * Named, reasoned deviations from fluids, keyed "NPS|schedule". Empty: at the time of
 * writing every entry agrees within the tolerances above and both sides list the same
 * combinations. Add an entry only with the reason the standard is believed to differ from
 * fluids, e.g. `'3-1/2|XXS': 'listed in …, absent in fluids because …'`.
 */
const EXCEPTIONS: Readonly<Record<string, string>> = {};

const TOL_WALL_MM = 0.006;
const TOL_WALL_IN_AS_MM = 0.011;
const TOL_OD_MM = 0.006;
const odInTolMm = (npsValue: number): number => (npsValue >= 14 ? 0.5 : 0.05 + 1e-6);

/** Every (NPS, schedule) our tables hold. */
function ourEntries(): PipeWall[] {
  const out: PipeWall[] = [];
  for (const nps of NPS_SIZES) {
    for (const schedule of SCHEDULES) {
      const wall = getPipeWall(nps, schedule);
      if (wall) out.push(wall);
    }
  }
  return out;
}

interface Comparison {
  compared: number;
  matched: number;
  mismatches: string[];
  onlyOurs: string[];
  onlyFluids: string[];
  exceptionsHit: Set<string>;
}

function compare(entries: FluidsEntry[]): Comparison {
  const fluids = new Map<string, FluidsEntry>();
  const onlyFluids: string[] = [];
  for (const e of entries) {
    const nps = normalizeNps(e.nps);
    if (nps === undefined) {
      onlyFluids.push(`NPS ${e.nps} ${e.schedule} (NPS not in our size list)`);
      continue;
    }
    fluids.set(`${nps}|${e.schedule}`, e);
  }
  const result: Comparison = {
    compared: 0,
    matched: 0,
    mismatches: [],
    onlyOurs: [],
    onlyFluids,
    exceptionsHit: new Set(),
  };
  const ours = new Set<string>();
  for (const w of ourEntries()) {
    const k = `${w.nps}|${w.schedule}`;
    ours.add(k);
    const f = fluids.get(k);
    if (!f) {
      if (k in EXCEPTIONS) result.exceptionsHit.add(k);
      else result.onlyOurs.push(k);
      continue;
    }
    result.compared += 1;
    const problems: string[] = [];
    if (Math.abs(w.wallMm - f.t_mm) > TOL_WALL_MM)
      problems.push(`wall ${w.wallMm} mm vs ${f.t_mm}`);
    if (Math.abs(w.wallIn * 25.4 - f.t_mm) > TOL_WALL_IN_AS_MM) {
      problems.push(`wall ${w.wallIn} in (${(w.wallIn * 25.4).toFixed(3)} mm) vs ${f.t_mm}`);
    }
    if (Math.abs(w.odMm - f.do_mm) > TOL_OD_MM) problems.push(`OD ${w.odMm} mm vs ${f.do_mm}`);
    if (Math.abs(w.odIn * 25.4 - f.do_mm) > odInTolMm(npsToNumber(w.nps))) {
      problems.push(`OD ${w.odIn} in (${(w.odIn * 25.4).toFixed(2)} mm) vs ${f.do_mm}`);
    }
    if (problems.length === 0) result.matched += 1;
    else if (k in EXCEPTIONS) result.exceptionsHit.add(k);
    else result.mismatches.push(`${k} [${w.standard}]: ${problems.join('; ')}`);
  }
  for (const k of fluids.keys()) {
    if (ours.has(k)) continue;
    if (k in EXCEPTIONS) result.exceptionsHit.add(k);
    else result.onlyFluids.push(k);
  }
  return result;
}

const loaded = loadFluids();

describe('pipe dimensions vs python3-fluids (ASME B36.10M-2004 / B36.19M-2004 tabulation)', () => {
  if (!loaded.ok) {
    if (process.env.CI) {
      it('has python3-fluids available (required in CI)', () => {
        throw new Error(`python3-fluids is required in CI: ${loaded.reason}`);
      });
    } else {
      console.warn(`fluids cross-check skipped: ${loaded.reason}`);
      it.skip(`cross-check skipped: ${loaded.reason}`, () => {});
    }
    return;
  }

  const result = compare(loaded.entries);

  it('reads a plausible fluids tabulation', () => {
    // 360 entries for our 17 schedules in fluids 1.0.22 (counted from its output).
    expect(loaded.entries.length).toBeGreaterThan(300);
  });

  it('compares a large number of entries', () => {
    // Our tables hold 360 (NPS, schedule) entries (counted from the data file).
    expect(ourEntries().length).toBeGreaterThanOrEqual(350);
    expect(result.compared).toBeGreaterThanOrEqual(350);
  });

  it('agrees with fluids on OD and wall for every entry both hold', () => {
    expect(result.mismatches).toEqual([]);
    expect(result.matched + result.exceptionsHit.size).toBeGreaterThanOrEqual(result.compared);
  });

  it('lists the same (NPS, schedule) combinations as fluids', () => {
    expect({ onlyOurs: result.onlyOurs, onlyFluids: result.onlyFluids }).toEqual({
      onlyOurs: [],
      onlyFluids: [],
    });
  });

  it('would catch a 0.001 in wall slip, a 0.1 mm OD slip and one-sided entries', () => {
    // Self-test of the comparison on a tampered copy of fluids' data, so this suite cannot
    // pass by comparing nothing. NPS 2 Sch 40: 0.154 in = 3.91 mm, OD 60.3 mm (ASME B36.10M).
    const tampered = loaded.entries
      .filter((e) => !(e.nps === 4 && e.schedule === '80'))
      .map((e) =>
        e.nps === 2 && e.schedule === '40'
          ? { ...e, t_mm: 3.91 + 0.0254 }
          : e.nps === 6 && e.schedule === '40'
            ? { ...e, do_mm: 168.3 + 0.1 }
            : e,
      );
    tampered.push({ nps: 3.5, schedule: 'XXS', do_mm: 101.6, t_mm: 16.15 });
    const r = compare(tampered);
    expect(r.mismatches.map((m) => m.split(' ')[0])).toEqual(['2|40', '6|40']);
    expect(r.onlyOurs).toEqual(['4|80']);
    expect(r.onlyFluids).toEqual(['3-1/2|XXS']);
  });

  it('carries no stale exceptions', () => {
    expect(Object.keys(EXCEPTIONS).filter((k) => !result.exceptionsHit.has(k))).toEqual([]);
  });

  it('reports the comparison', () => {
    console.info(
      `fluids ${loaded.version} via ${loaded.python}: ${result.compared} compared, ` +
        `${result.matched} matched, ${result.exceptionsHit.size} named exceptions`,
    );
    expect(result.compared).toBeGreaterThan(0);
  });
});
