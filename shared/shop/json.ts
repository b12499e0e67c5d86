/** The headless fabrication sheet's JSON (`npm run shop -- --json`), in the document's units (mass lb | kg). */
import type { FabricationSheet } from './fabrication-sheet';

export interface ShopJson {
  readonly units: FabricationSheet['units'];
  readonly elements: readonly {
    id: string;
    kind: string;
    nps: string | null;
    schedule: string | null;
    orderSchedule: string | null;
    orderWall: number;
    cutLength: number;
    mass: number;
    bend?: {
      angle: number;
      radius: number;
      radiusOverD: number;
      tableFactor: number | null;
      wallBeforeBending: number;
      extradosWallAfter: number;
      intradosWallAfter: number;
      arcLength: number;
      tangent: number;
    };
  }[];
  readonly bom: readonly {
    nps: string | null;
    schedule: string | null;
    material: string | null;
    length: number;
    mass: number;
  }[];
  readonly welds: number;
  readonly developedLength: number;
  readonly totalMass: number;
  readonly filledMass: number;
  readonly hydrotest: {
    pressure: number;
    ratio: number;
    limitedBy: string | null;
    governing: string | null;
    equation: string;
  } | null;
  readonly caution: string;
}

/** The sheet reduced to the documented JSON shape. */
export function toShopJson(sheet: FabricationSheet): ShopJson {
  return {
    units: sheet.units,
    elements: sheet.elements.map((e) => ({
      id: e.id,
      kind: e.kind,
      nps: e.nps,
      schedule: e.schedule,
      orderSchedule: e.orderSchedule,
      orderWall: e.orderWall,
      cutLength: e.cutLength,
      mass: e.mass,
      ...(e.bend
        ? {
            bend: {
              angle: e.bend.angle,
              radius: e.bend.radius,
              radiusOverD: e.bend.radiusOverD,
              tableFactor: e.bend.tableFactor,
              wallBeforeBending: e.bend.wallBeforeBending,
              extradosWallAfter: e.bend.extradosWallAfter,
              intradosWallAfter: e.bend.intradosWallAfter,
              arcLength: e.bend.arcLength,
              tangent: e.bend.tangent,
            },
          }
        : {}),
    })),
    bom: sheet.bom.map((b) => ({
      nps: b.nps,
      schedule: b.schedule,
      material: b.material,
      length: b.length,
      mass: b.mass,
    })),
    welds: sheet.welds,
    developedLength: sheet.developedLength,
    totalMass: sheet.totalMass,
    filledMass: sheet.filledMass,
    hydrotest: sheet.hydrotest
      ? {
          pressure: sheet.hydrotest.pressure,
          ratio: sheet.hydrotest.ratio,
          limitedBy: sheet.hydrotest.limitedBy,
          governing: sheet.hydrotest.governing,
          equation: sheet.hydrotest.equation,
        }
      : null,
    caution: sheet.caution,
  };
}
