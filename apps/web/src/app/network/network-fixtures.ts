import type {
  BomNodeDto,
  CountryDto,
  NetworkSupplierDto,
  NetworkVersionDto,
  PlantDto,
  SourcingLinkDto,
  SupplierDetailDto,
} from '@keelson/contracts';

/**
 * Answers of the network API for the client's specs, shaped like the DTOs in
 * libs/contracts/src/network.ts. Invented companies and codes (the demo's naming pattern);
 * nothing here describes a real supplier.
 */

/** Two plants of the invented demo workspace. */
export const PLANTS: PlantDto[] = [
  { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
  { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
];

/** A few countries with shipped (invented) hazard ratings. */
export const COUNTRIES: CountryDto[] = [
  country('DE', 'Germany', 'Europe', 2),
  country('ES', 'Spain', 'Europe', 2),
  country('VN', 'Viet Nam', 'Asia', 3),
];

/** A country row as GET /api/countries lists it. */
export function country(code: string, name: string, region: string, hazard: number): CountryDto {
  return {
    code,
    name,
    region,
    hazard,
    isDefault: true,
    updatedAt: '2026-11-01T09:00:00.000Z',
    updatedBy: null,
  };
}

/** A network version with every count and change overridable. */
export function version(id: number, overrides: Partial<NetworkVersionDto> = {}): NetworkVersionDto {
  return {
    id,
    label: `Import ${id + 10}: tarnwell-network-${id}.xlsx`,
    createdAt: '2026-11-30T10:15:00.000Z',
    createdBy: { id: 2, name: 'Bruno Keller' },
    importBatchId: id + 10,
    fileName: `tarnwell-network-${id}.xlsx`,
    previousVersionId: id > 1 ? id - 1 : null,
    counts: {
      plants: 2,
      products: 14,
      items: 320,
      bomLines: 410,
      suppliers: 12_480,
      sourcing: 15_020,
      stock: 180,
    },
    changes: {
      previousVersionId: id > 1 ? id - 1 : null,
      suppliersAdded: ['S-0901', 'S-0902'],
      suppliersRemoved: [],
      suppliersChanged: ['S-0007'],
      sourcingAdded: 4,
      sourcingRemoved: 1,
      sourcingChanged: 0,
      productsAdded: [],
      productsRemoved: [],
      productsChanged: [],
    },
    isLatest: true,
    ...overrides,
  };
}

/** A supplier row as the suppliers table lists it. */
export function supplierRow(
  code: string,
  overrides: Partial<NetworkSupplierDto> = {},
): NetworkSupplierDto {
  return {
    code,
    name: `Supplier ${code}`,
    country: 'DE',
    region: 'Europe',
    tier: 1,
    recoveryWeeks: 8,
    financialHealth: 62,
    deliveryScore: 91,
    hasContinuityPlan: true,
    plants: ['P-NORTH'],
    sellsCount: 1,
    buysCount: 0,
    row: 2,
    ...overrides,
  };
}

/** A sourcing row with the given ends. */
export function link(overrides: Partial<SourcingLinkDto>): SourcingLinkDto {
  return {
    buyerCode: 'P-NORTH',
    buyerKind: 'plant',
    buyerName: 'Varnholm Works',
    itemCode: 'I-100',
    supplierCode: 'S-0101',
    supplierName: 'Orvik Castings',
    sharePct: 100,
    isQualified: true,
    qualifiedSources: 2,
    row: 5,
    ...overrides,
  };
}

/** A tier-1 supplier that sells to a plant and to another supplier, and buys from a third. */
export const SUPPLIER_DETAIL: SupplierDetailDto = {
  ...supplierRow('S-0101', {
    name: 'Orvik Castings',
    tier: 1,
    recoveryWeeks: 12,
    plants: ['P-NORTH', 'P-SOUTH'],
    sellsCount: 2,
    buysCount: 1,
  }),
  networkVersionId: 7,
  sells: [
    link({ itemCode: 'I-100', qualifiedSources: 1, sharePct: 100 }),
    link({
      itemCode: 'I-220',
      buyerCode: 'S-0300',
      buyerKind: 'supplier',
      buyerName: 'Halden Gears',
      sharePct: 40,
      qualifiedSources: 3,
    }),
  ],
  buys: [
    link({
      itemCode: 'R-7',
      buyerCode: 'S-0101',
      buyerKind: 'supplier',
      buyerName: 'Orvik Castings',
      supplierCode: 'S-0555',
      supplierName: 'Brekka Alloys',
      sharePct: null,
    }),
  ],
  attributes: { 'Account manager': 'Lene Dahl', Incoterm: 'FCA' },
  importBatch: {
    id: 17,
    fileName: 'tarnwell-network-7.xlsx',
    createdAt: '2026-11-30T10:15:00.000Z',
    createdBy: 'Bruno Keller',
  },
};

/** The top level of a product's bill of materials: one made and one bought child. */
export const BOM_ROOT: BomNodeDto = {
  code: 'FP-10',
  kind: 'product',
  plantCode: 'P-NORTH',
  name: 'Hydraulic pump HP-10',
  children: [
    {
      code: 'A-200',
      qtyPer: 1,
      kind: 'made',
      qualifiedSources: null,
      weeksOfCover: null,
      hasChildren: true,
    },
    {
      code: 'I-100',
      qtyPer: 4,
      kind: 'bought',
      qualifiedSources: 1,
      weeksOfCover: 2.5,
      hasChildren: false,
    },
  ],
  sources: [],
};
