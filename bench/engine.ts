/**
 * Engine benchmark: checks a 10,000-element spool repeatedly and prints element-checks per second,
 * and the ratio to a bare loop of Eq. (3a) over the same inputs. Prints figures; no pass/fail.
 * Run: npm run bench:engine
 */
import { performance } from 'node:perf_hooks';
import type { SpoolDocument, SpoolElement } from '../shared/model/spool';
import { checkSpool, createSpoolChecker, straightThickness } from '../shared/engine/index';
import { listPipeWalls, NPS_SIZES } from '../shared/data/pipe-dimensions';

const N = 10_000;
const sizes = NPS_SIZES.filter((n) => listPipeWalls(n).some((w) => w.schedule === '40'));

function makeSpool(external: boolean): SpoolDocument {
  const elements: SpoolElement[] = [];
  for (let i = 0; i < N; i++) {
    const nps = sizes[i % sizes.length] ?? '4';
    elements.push(
      i % 2 === 0
        ? { id: `S${i}`, kind: 'straight', nps, schedule: '40', length: 100 + (i % 50) }
        : { id: `B${i}`, kind: 'bend', nps, schedule: '40', bendRadius: { multipleOfD: 3 + (i % 3) }, angle: 90 },
    );
  }
  return {
    units: 'imperial',
    conditions: { pressure: 300, temperature: 400, material: 'A106-B', corrosionAllowance: 0.0625, ...(external ? { externalPressure: 14.7, stiffenedLength: 240 } : {}) },
    elements,
  };
}

function bench(label: string, doc: SpoolDocument, minMs = 3000): number {
  checkSpool(doc); // warm-up
  let runs = 0;
  const t0 = performance.now();
  let elapsed = 0;
  while (elapsed < minMs) {
    checkSpool(doc);
    runs++;
    elapsed = performance.now() - t0;
  }
  const rate = (runs * doc.elements.length) / (elapsed / 1000);
  console.log(`${label.padEnd(44)} ${runs} runs × ${doc.elements.length} elements in ${elapsed.toFixed(0)} ms → ${Math.round(rate).toLocaleString('en-US')} element-checks/s (${(elapsed / runs).toFixed(1)} ms per spool)`);
  return rate;
}

function bareLoop(doc: SpoolDocument, minMs = 1500): number {
  const D = doc.elements.map((el) => listPipeWalls(String(el.nps)).find((w) => w.schedule === '40')?.odIn ?? 4.5);
  const P = doc.conditions.pressure;
  let sink = 0;
  let runs = 0;
  const t0 = performance.now();
  let elapsed = 0;
  while (elapsed < minMs) {
    for (let i = 0; i < D.length; i++) sink += straightThickness(P, D[i] ?? 1, 20000, 1, 1, 0.4);
    runs++;
    elapsed = performance.now() - t0;
  }
  const rate = (runs * D.length) / (elapsed / 1000);
  console.log(`${'bare Eq. (3a) loop, same inputs'.padEnd(44)} ${Math.round(rate).toLocaleString('en-US')} evaluations/s (checksum ${sink.toExponential(3)})`);
  return rate;
}

console.log(`Spoolwright engine benchmark — node ${process.version}, ${N.toLocaleString('en-US')} elements (half straights, half bends), NPS 1/8–48 Sch 40`);
const internal = bench('internal pressure only', makeSpool(false));
const external = bench('internal + external pressure (vacuum)', makeSpool(true));
const bare = bareLoop(makeSpool(false));
console.log(`ratio bare loop / engine: internal ${(bare / internal).toFixed(0)}×, with external ${(bare / external).toFixed(0)}×`);

// The sketcher's path: a memoizing checker re-checks only the edited element.
{
  const doc = makeSpool(false);
  const checker = createSpoolChecker();
  checker(doc);
  const edits = 200;
  const t0 = performance.now();
  let current = doc;
  for (let k = 0; k < edits; k++) {
    const i = (k * 37) % current.elements.length;
    const el = current.elements[i];
    if (!el) continue;
    const changed = el.kind === 'straight' ? { ...el, length: el.length + 1 } : { ...el, angle: el.angle === 90 ? 45 : 90 };
    current = { ...current, elements: current.elements.map((e, j) => (j === i ? changed : e)) };
    checker(current);
  }
  const ms = (performance.now() - t0) / edits;
  console.log(`${'edit one element, re-check 10,000 (memoized)'.padEnd(44)} ${ms.toFixed(2)} ms per edit`);
}
