import { Router } from 'express';
import { requireSignedIn } from '../auth/member';
import { MATERIALS } from '../../shared/data/materials';
import { NPS_SIZES, PIPE_DIMENSION_SOURCES, SCHEDULES, getPipeSize, listPipeWalls } from '../../shared/data/pipe-dimensions';

/** Pickers' data: built once, it never changes while the process runs. */
function buildDimensions() {
  const sizes = NPS_SIZES.map((nps) => {
    const size = getPipeSize(nps) ?? getPipeSize(nps, 'B36.19M');
    return {
      nps,
      npsValue: size?.npsValue ?? null,
      dn: size?.dn ?? null,
      odIn: size?.odIn ?? null,
      odMm: size?.odMm ?? null,
      walls: listPipeWalls(nps).map((w) => ({ schedule: w.schedule, standard: w.standard, wallIn: w.wallIn, wallMm: w.wallMm, odIn: w.odIn, odMm: w.odMm })),
    };
  });
  return { schedules: SCHEDULES, sizes, sources: PIPE_DIMENSION_SOURCES };
}

export function catalogRouter() {
  const r = Router();
  let dimensions: ReturnType<typeof buildDimensions> | undefined;
  r.get('/materials', requireSignedIn, (_req, res) => {
    res.json({ items: MATERIALS });
  });
  r.get('/dimensions', requireSignedIn, (_req, res) => {
    dimensions ??= buildDimensions();
    res.json(dimensions);
  });
  return r;
}
