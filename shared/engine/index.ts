/** The check engine's public surface: the only barrel of shared/engine. */
export { checkSpool, createSpoolChecker, worseStatus } from './check-spool';
export type { CheckOptions } from './check-spool';
export { checkElement, MARGINAL_LIMIT } from './check-element';
export { resolveElement } from './resolve';
export type { MaterialFinder, ResolvedElement } from './resolve';
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
export { externalAllowable, factorA, minimumExternalWall } from './external';
export { fmt } from './format';
export * from './types';
