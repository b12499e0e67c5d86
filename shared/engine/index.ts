/** The check engine's public surface: the only barrel of shared/engine. */
export {
  checkSpool,
  checkSpoolFigures,
  createSpoolChecker,
  explainElement,
  visitSpoolFigures,
  worseStatus,
} from './check-spool';
export type { CheckOptions, SpoolFiguresSummary } from './check-spool';
export { checkElement, checkElementFigures, figuresOf, MARGINAL_LIMIT } from './check-element';
export { resolveElement, SPOOL_STRESS_CODE } from './resolve';
export type { MaterialFinder, ResolveCache, ResolvedElement } from './resolve';
export {
  bendThickness,
  extradosFactor,
  intradosFactor,
  longTubeCollapsePressure,
  pressureForThickness,
  straightThickness,
  straightThicknessFromId,
  thickWallY,
} from './equations';
export {
  EXTERNAL_BASIS_LABEL,
  externalAllowable,
  externalAllowablePressure,
  factorA,
  minimumExternalWall,
} from './external';
export { fmt } from './format';
export * from './types';
