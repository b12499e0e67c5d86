/** The fabrication sheet: pure functions from a spool document and its check. The only barrel of shared/shop. */
export { buildFabricationSheet, FLATTENING_NOTE } from './fabrication-sheet';
export type {
  BomLine,
  EndPrep,
  FabricationOptions,
  FabricationSheet,
  ShopBend,
  ShopElement,
} from './fabrication-sheet';
export {
  computeHydrotest,
  HYDROTEST_CAUTION,
  HYDROTEST_RATIO_CAP,
  yieldLimitedPressure,
} from './hydrotest';
export type { Hydrotest, HydrotestElement, HydrotestElementInput } from './hydrotest';
export { contentMassPerLength, pipeMassPerLength, pipeMassPerRun } from './mass';
export { bendArcLength, bendTangentLength } from './geometry';
export {
  bomTable,
  csvFileName,
  cutListTable,
  elementTable,
  sheetTable,
  tableToCsv,
} from './tables';
export type { Table, TableName } from './tables';
export { toShopJson } from './json';
export type { ShopJson } from './json';
