/**
 * The worked example of docs/methods.md: two plants, four products, nine suppliers. It shows a
 * hidden shared tier-2 supplier (S4) under a dual-sourced item (I2 from S2 or S3), a supplier
 * cycle (S5 and S6 sell to each other), stock cover, an unqualified row (S9), an unsourced item
 * (I6, so F4 is down at baseline) and stock of a made item (A1, ignored). The expected values
 * below were computed by hand from spec sections 2-4, not by this library; docs/methods.md shows
 * the working.
 */
import type { SupplyModel } from '@keelson/contracts';

const supplier = (
  code: string,
  country: string,
  region: string,
  recoveryWeeks: number,
  row: number,
) => ({
  code,
  name: `Supplier ${code.slice(1)}`,
  country,
  region,
  recoveryWeeks,
  financialHealth: 3,
  deliveryScore: 4,
  hasContinuityPlan: false,
  row,
});

const sourcing = (
  rows: Array<[buyer: string, item: string, supplier: string, qualified?: boolean]>,
) =>
  rows.map(([buyerCode, itemCode, supplierCode, isQualified = true], i) => ({
    buyerCode,
    itemCode,
    supplierCode,
    sharePct: null,
    isQualified,
    row: i + 2,
  }));

/** The worked example as a supply model (rows numbered as in a template workbook). */
export const WORKED_EXAMPLE: SupplyModel = {
  plants: [
    { code: 'P1', name: 'Plant North', country: 'DE', row: 2 },
    { code: 'P2', name: 'Plant South', country: 'FR', row: 3 },
  ],
  products: [
    { code: 'F1', plantCode: 'P1', name: 'Pump housing', weeklyRevenue: 50_000, row: 2 },
    { code: 'F2', plantCode: 'P1', name: 'Valve body', weeklyRevenue: 30_000, row: 3 },
    { code: 'F3', plantCode: 'P2', name: 'Gear unit', weeklyRevenue: 20_000, row: 4 },
    { code: 'F4', plantCode: 'P2', name: 'Sensor kit', weeklyRevenue: 10_000, row: 5 },
  ],
  bom: [
    ['F1', 'A1'], ['F1', 'I3'], ['A1', 'I1'], ['A1', 'I2'], ['F2', 'I2'], ['F2', 'I4'],
    ['F3', 'I4'], ['F3', 'I5'], ['F4', 'I5'], ['F4', 'I6'],
  ].map(([parentCode, childCode], i) => ({
    parentCode: parentCode!,
    childCode: childCode!,
    qtyPer: 1,
    row: i + 2,
  })),
  suppliers: [
    supplier('S1', 'DE', 'Europe', 6, 2),
    supplier('S2', 'CN', 'Asia', 10, 3),
    supplier('S3', 'CN', 'Asia', 4, 4),
    supplier('S4', 'TW', 'Asia', 12, 5),
    supplier('S5', 'PL', 'Europe', 8, 6),
    supplier('S6', 'PL', 'Europe', 5, 7),
    supplier('S7', 'MX', 'Americas', 3, 8),
    supplier('S8', 'US', 'Americas', 9, 9),
    supplier('S9', 'DE', 'Europe', 8, 10),
  ],
  sourcing: sourcing([
    ['P1', 'I1', 'S1'],
    ['P1', 'I1', 'S9', false],
    ['P1', 'I2', 'S2'],
    ['P1', 'I2', 'S3'],
    ['P1', 'I3', 'S5'],
    ['P1', 'I4', 'S7'],
    ['P2', 'I4', 'S7'],
    ['P2', 'I4', 'S8'],
    ['P2', 'I5', 'S8'],
    ['S2', 'C1', 'S4'],
    ['S3', 'C1', 'S4'],
    ['S5', 'C2', 'S6'],
    ['S6', 'C3', 'S5'],
  ]),
  stock: [
    ['P1', 'I1', 2], ['P1', 'I2', 1], ['P1', 'I3', 4], ['P1', 'I4', 0], ['P2', 'I4', 3],
    ['P2', 'I5', 6], ['P1', 'A1', 10],
  ].map(([plantCode, itemCode, weeksOfCover], i) => ({
    plantCode: plantCode as string,
    itemCode: itemCode as string,
    weeksOfCover: weeksOfCover as number,
    row: i + 2,
  })),
};

/** A hand-computed lost product: time to survive, lost weeks. */
export interface WorkedProduct {
  code: string;
  timeToSurvive: number;
  lostWeeks: number;
}

/** A hand-computed supplier row of the worked example. */
export interface WorkedSupplier {
  code: string;
  tier: number | null;
  timeToRecover: number;
  products: WorkedProduct[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  /** Subset betweenness counted by hand (raw-material suppliers S1, S4, S7, S8, S9 to F1-F4). */
  betweenness: number;
}

const lost = (code: string, timeToSurvive: number, lostWeeks: number): WorkedProduct => ({
  code,
  timeToSurvive,
  lostWeeks,
});

const row = (
  code: string,
  tier: number | null,
  timeToRecover: number,
  products: WorkedProduct[],
  revenueExposedPerWeek: number,
  revenueImpact: number,
  betweenness: number,
): WorkedSupplier => ({
  code,
  tier,
  timeToRecover,
  products,
  revenueExposedPerWeek,
  revenueImpact,
  betweenness,
});

/** The hand-computed scenario of the worked example. */
export interface WorkedScenario {
  failed: string[];
  timeToRecover: number;
  products: WorkedProduct[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
}

/** The hand computation of docs/methods.md, one row per supplier, by code. */
export const WORKED_EXAMPLE_EXPECTED: {
  suppliers: WorkedSupplier[];
  productsDownAtBaseline: string[];
  /** `failCountry: ' cn '` fails S2 and S3 (trimmed, case-insensitive). */
  scenarioCn: WorkedScenario;
} = {
  suppliers: [
    // code, tier, TTR, lost products (TTS, lost weeks), exposed per week, impact, betweenness
    row('S1', 1, 6, [lost('F1', 2, 4)], 50_000, 200_000, 0),
    row('S2', 1, 10, [], 0, 0, 1),
    row('S3', 1, 4, [], 0, 0, 1),
    row('S4', 2, 12, [lost('F1', 1, 11), lost('F2', 1, 11)], 80_000, 880_000, 0),
    row('S5', 1, 8, [lost('F1', 4, 4)], 50_000, 200_000, 0),
    row('S6', 2, 5, [lost('F1', 4, 1)], 50_000, 50_000, 0),
    row('S7', 1, 3, [lost('F2', 0, 3)], 30_000, 90_000, 0),
    row('S8', 1, 9, [lost('F3', 6, 3)], 20_000, 60_000, 0),
    row('S9', null, 8, [], 0, 0, 0),
  ],
  productsDownAtBaseline: ['F4'],
  scenarioCn: {
    failed: ['S2', 'S3'],
    timeToRecover: 10,
    products: [lost('F1', 1, 9), lost('F2', 1, 9)],
    revenueExposedPerWeek: 80_000,
    revenueImpact: 720_000,
  },
};
