/**
 * Engine benchmark: checks a 10,000-element spool repeatedly and prints element-checks per second
 * for the numbers-first path (streamed with `visitSpoolFigures`, and collected with
 * `checkSpoolFigures`) and the trail path (`checkSpool`), each as a ratio to a bare loop of
 * Eq. (3a) over the same diameters in the same run, and the memoising checker's re-check after
 * one edit. Rates are per second of this process's CPU time (user + system, which includes the
 * garbage collector's threads), so other load on a shared machine does not skew the ratios; the
 * wall-clock rate is printed beside. Prints figures and the goals; no pass/fail exit.
 * Run: npm run bench:engine
 */
import { performance } from 'node:perf_hooks';
import type { SpoolDocument, SpoolElement } from '../shared/model/spool';
import {
  checkSpool,
  checkSpoolFigures,
  createSpoolChecker,
  straightThickness,
  visitSpoolFigures,
} from '../shared/engine/index';
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
        : {
            id: `B${i}`,
            kind: 'bend',
            nps,
            schedule: '40',
            bendRadius: { multipleOfD: 3 + (i % 3) },
            angle: 90,
          },
    );
  }
  return {
    units: 'imperial',
    conditions: {
      pressure: 300,
      temperature: 400,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      ...(external ? { externalPressure: 14.7, stiffenedLength: 240 } : {}),
    },
    elements,
  };
}

const fmtRate = (r: number) => Math.round(r).toLocaleString('en-US');
/** CPU time of this process, ms (user + system: the main thread and the GC's helper threads). */
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

function bench(
  label: string,
  doc: SpoolDocument,
  run: (d: SpoolDocument) => unknown,
  minMs: number,
): number {
  run(doc); // warm-up
  run(doc);
  let runs = 0;
  const c0 = cpuMs();
  const t0 = performance.now();
  let cpu = 0;
  while (cpu < minMs) {
    run(doc);
    runs++;
    cpu = cpuMs() - c0;
  }
  const wall = performance.now() - t0;
  const rate = (runs * doc.elements.length) / (cpu / 1000);
  const wallRate = (runs * doc.elements.length) / (wall / 1000);
  console.log(
    `${label.padEnd(60)} ${String(runs).padStart(5)} runs → ${fmtRate(rate).padStart(11)} element-checks/s CPU (${(cpu / runs).toFixed(2)} ms CPU per spool; wall clock ${fmtRate(wallRate)}/s)`,
  );
  return rate;
}

function bareLoop(doc: SpoolDocument, minMs = 1500): number {
  const D = doc.elements.map(
    (el) => listPipeWalls(String(el.nps)).find((w) => w.schedule === '40')?.odIn ?? 4.5,
  );
  const P = doc.conditions.pressure;
  let sink = 0;
  let runs = 0;
  const c0 = cpuMs();
  let cpu = 0;
  while (cpu < minMs) {
    for (let i = 0; i < D.length; i++) sink += straightThickness(P, D[i] ?? 1, 20000, 1, 1, 0.4);
    runs++;
    cpu = cpuMs() - c0;
  }
  const rate = (runs * D.length) / (cpu / 1000);
  console.log(
    `${'bare Eq. (3a) loop, same diameters'.padEnd(60)} ${fmtRate(rate).padStart(23)} evaluations/s CPU (checksum ${sink.toExponential(3)})`,
  );
  return rate;
}

/** A spool whose every element has its own diameter: nothing repeats between elements. */
function makeDistinctSpool(): SpoolDocument {
  const elements: SpoolElement[] = [];
  for (let i = 0; i < N; i++) {
    const D = 2 + (i * 46) / N;
    elements.push(
      i % 2 === 0
        ? { id: `S${i}`, kind: 'straight', outsideDiameter: D, nominalWall: D / 40, length: 100 }
        : {
            id: `B${i}`,
            kind: 'bend',
            outsideDiameter: D,
            nominalWall: D / 40,
            bendRadius: 3 * D,
            angle: 90,
          },
    );
  }
  return {
    units: 'imperial',
    conditions: {
      pressure: 300,
      temperature: 400,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      externalPressure: 14.7,
      stiffenedLength: 240,
    },
    elements,
  };
}

let sinkCount = 0;
const stream = (d: SpoolDocument) =>
  visitSpoolFigures(d, (f) => {
    sinkCount += f.mawp > 0 ? 1 : 0;
  });

console.log(
  `Spoolwright engine benchmark — node ${process.version}, ${N.toLocaleString('en-US')} elements (half straights, half 3D/4D/5D bends), NPS 1/8–48 Sch 40, A106 B at 400 °F`,
);
const internalDoc = makeSpool(false);
const externalDoc = makeSpool(true);
const bare = bareLoop(internalDoc);
const streamInt = bench('numbers-first, streamed, internal pressure', internalDoc, stream, 3000);
const streamExt = bench(
  'numbers-first, streamed, internal + external (vacuum, L 240 in)',
  externalDoc,
  stream,
  3000,
);
const streamDistinct = bench(
  'numbers-first, streamed, external, every diameter different',
  makeDistinctSpool(),
  stream,
  2000,
);
const keptInt = bench(
  'numbers-first, all figures kept, internal pressure',
  internalDoc,
  (d) => checkSpoolFigures(d),
  3000,
);
const keptExt = bench(
  'numbers-first, all figures kept, internal + external',
  externalDoc,
  (d) => checkSpoolFigures(d),
  3000,
);
const fullInt = bench(
  'with trail (checkSpool), internal pressure',
  internalDoc,
  (d) => checkSpool(d),
  2000,
);
const fullExt = bench(
  'with trail (checkSpool), internal + external',
  externalDoc,
  (d) => checkSpool(d),
  2000,
);
const ratio = (r: number) => `${(bare / r).toFixed(0)}×`;
console.log(
  `ratio bare loop / engine (CPU): streamed internal ${ratio(streamInt)}, external ${ratio(streamExt)}, external all-distinct ${ratio(streamDistinct)}; kept internal ${ratio(keptInt)}, external ${ratio(keptExt)}; trail internal ${ratio(fullInt)}, external ${ratio(fullExt)}`,
);

// The sketcher's path: a memoising checker re-checks only the edited element (full trail for it).
// The edited documents are built first, so the time is the checker call alone.
function editBench(doc: SpoolDocument, label: string): number {
  const checker = createSpoolChecker();
  checker(doc);
  const edits = 200;
  const docs: SpoolDocument[] = [];
  let current = doc;
  for (let k = 0; k < edits; k++) {
    const i = (k * 37) % current.elements.length;
    const el = current.elements[i];
    if (!el) continue;
    const changed =
      el.kind === 'straight'
        ? { ...el, length: el.length + 1 }
        : { ...el, angle: el.angle === 90 ? 45 : 90 };
    const elements = current.elements.slice();
    elements[i] = changed;
    current = { ...current, elements };
    docs.push(current);
  }
  const times: number[] = [];
  for (const d of docs) {
    const c0 = cpuMs();
    checker(d);
    times.push(cpuMs() - c0);
  }
  times.sort((a, b) => a - b);
  const mean = times.reduce((a, b) => a + b, 0) / times.length;
  const median = times[Math.floor(times.length / 2)] ?? 0;
  const p95 = times[Math.floor(times.length * 0.95)] ?? 0;
  console.log(
    `${label.padEnd(60)} mean ${mean.toFixed(3)} ms, median ${median.toFixed(3)} ms, p95 ${p95.toFixed(3)} ms CPU per edit`,
  );
  return mean;
}
const editInt = editBench(internalDoc, 'edit one element, re-check 10,000 (memoised)');
const editExt = editBench(externalDoc, 'same, with external pressure');

const ok = (b: boolean) => (b ? 'met' : 'NOT met');
console.log('goals (CPU time):');
console.log(
  `  ≥ 1,000,000 element-checks/s internal, ≤ 500× the bare loop: streamed ${fmtRate(streamInt)}/s ${ratio(streamInt)} — ${ok(streamInt >= 1e6 && bare / streamInt <= 500)}; kept ${fmtRate(keptInt)}/s ${ratio(keptInt)} — ${ok(keptInt >= 1e6 && bare / keptInt <= 500)}`,
);
console.log(
  `  ≥ 250,000 element-checks/s with external pressure: streamed ${fmtRate(streamExt)}/s — ${ok(streamExt >= 250e3)}; every diameter different ${fmtRate(streamDistinct)}/s — ${ok(streamDistinct >= 250e3)}; kept ${fmtRate(keptExt)}/s — ${ok(keptExt >= 250e3)}`,
);
console.log(
  `  re-check of 10,000 elements after one edit ≤ 1 ms: ${editInt.toFixed(3)} ms (external ${editExt.toFixed(3)} ms) — ${ok(editInt <= 1 && editExt <= 1)}`,
);
if (sinkCount < 0) console.log(sinkCount);
