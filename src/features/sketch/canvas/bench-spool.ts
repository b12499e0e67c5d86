import type { Direction, SpoolDocument } from '@shared/model/spool';
import { createSpoolStore } from '../store/spool-store';

/** Schedules cycled per leg so the bench spool shows several statuses (NPS 6 at 1,500 psi). */
const SCHEDULES = ['80', '40', '160', 'XS', '10', '120', 'STD', '80'];

/**
 * A generated spool of `count` elements for benchmarks: a serpentine of 6" legs (3D bends)
 * that fills rows east/west, steps north between rows and climbs a level after a number of
 * rows chosen so the spool stays roughly as wide as it is tall.
 */
export function generateBenchSpool(count: number): SpoolDocument {
  const store = createSpoolStore({
    units: 'imperial',
    name: `Bench spool (${count} elements)`,
    conditions: { pressure: 1500, temperature: 100, material: 'A106-B' },
    defaultBendRadius: { multipleOfD: 3 },
    elements: [],
  });
  const s = store.getState();
  s.startRun({ nps: '6', schedule: '80' }, { history: 'never' });
  const rows = Math.ceil(count / 4);
  const rowsPerLevel = Math.max(3, Math.round(Math.sqrt(rows * 1.5)));
  let row = 0;
  let leg = 0;
  let along: Direction = 'east';
  let step: Direction = 'north';
  while (store.getState().doc.elements.length < count) {
    s.setDrawingPipe({ nps: '6', schedule: SCHEDULES[leg % SCHEDULES.length]! });
    leg++;
    s.addLeg(along, 360, { history: 'never' });
    if (store.getState().doc.elements.length >= count) break;
    row++;
    if (row % rowsPerLevel === 0) {
      s.addLeg('up', 90, { history: 'never' });
      step = step === 'north' ? 'south' : 'north';
    } else s.addLeg(step, 90, { history: 'never' });
    along = along === 'east' ? 'west' : 'east';
  }
  const doc = store.getState().doc;
  return { ...doc, elements: doc.elements.slice(0, count) };
}
