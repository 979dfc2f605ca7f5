import type {
  ImportBatchDto,
  ImportCommitDto,
  InspectedSheet,
  SheetSuggestion,
  WorkbookInspection,
} from '@keelson/contracts';

/*
 * Answers of the import API for the client's specs, shaped like the DTOs in
 * libs/contracts/src/imports.ts. The file, its sheets and every code are invented: a buyer's own
 * workbook whose sheets and headers are not the template's.
 */

/** A batch as POST /api/imports answers it, with any field overridden. */
export function batchFixture(overrides: Partial<ImportBatchDto> = {}): ImportBatchDto {
  return {
    id: 41,
    status: 'needs_mapping',
    fileName: 'harbour-network.xlsx',
    fileSize: 48_213,
    sha256: 'c0ffee'.padEnd(64, '0'),
    format: 'xlsx',
    createdBy: { id: 2, name: 'Bruno Keller' },
    createdAt: '2026-11-30T09:30:00.000Z',
    sheets: [
      { name: 'Sites', rowCount: 3 },
      { name: 'Products', rowCount: 4 },
      { name: 'BOM', rowCount: 9 },
      { name: 'Vendors', rowCount: 6 },
      { name: 'Purchases', rowCount: 8 },
    ],
    counts: {},
    errorCount: 0,
    warningCount: 0,
    mapping: null,
    suggestedMapping: null,
    networkVersionId: null,
    committedAt: null,
    ...overrides,
  };
}

function suggestion(overrides: Partial<SheetSuggestion>): SheetSuggestion {
  return {
    isRequired: true,
    sheetName: null,
    headerRow: null,
    columns: {},
    missingColumns: [],
    unmatchedHeaders: [],
    ...overrides,
  };
}

type SheetWithoutTopRows = Omit<InspectedSheet, 'topRows'>;

/**
 * A sheet of the inspection with its first rows as the server sends them: a title row above a
 * header row that is not the first, then the header row, then the sample rows.
 */
export function withTopRows(sheet: SheetWithoutTopRows): InspectedSheet {
  const headerRow = sheet.headerRow ?? 1;
  const title = headerRow > 1 ? [{ row: 1, cells: [`${sheet.name} export`],
    headers: [`${sheet.name} export`] }] : [];
  const rows = [
    ...title,
    { row: headerRow, cells: [...sheet.headers], headers: [...sheet.headers] },
    ...sheet.sampleRows.map((cells, index) => ({
      row: headerRow + 1 + index,
      cells,
      headers: cells.filter((cell) => cell !== null && cell !== '').map((cell) => String(cell)),
    })),
  ];
  return { ...sheet, topRows: rows };
}

/** What GET /api/imports/41/inspection answers for the batch above. */
export function inspectionFixture(): WorkbookInspection {
  return {
    format: 'xlsx',
    errors: [],
    sheets: ([
      {
        name: 'Sites',
        rowCount: 3,
        headerRow: 2,
        headers: ['Site ID', 'Site', 'Land'],
        sampleRows: [
          ['HB-1', 'Harbour Works', 'NL'],
          ['HB-2', 'Dune Works', 'BE'],
        ],
      },
      {
        name: 'Products',
        rowCount: 4,
        headerRow: 1,
        headers: ['product_code', 'plant_code', 'product_name', 'weekly_revenue'],
        sampleRows: [['PR-10', 'HB-1', 'Bilge pump', 1200]],
      },
      {
        name: 'BOM',
        rowCount: 9,
        headerRow: 1,
        headers: ['parent_code', 'child_code', 'qty_per'],
        sampleRows: [['PR-10', 'IT-4', 2]],
      },
      {
        name: 'Vendors',
        rowCount: 6,
        headerRow: 1,
        headers: ['Vendor no', 'Vendor', 'Land', 'Has plan'],
        sampleRows: [['V-7', 'Kestrel Castings', 'PL', true]],
      },
      {
        name: 'Purchases',
        rowCount: 8,
        headerRow: 1,
        headers: ['Buyer', 'Part', 'Vendor no', 'Share'],
        sampleRows: [['HB-1', 'IT-4', 'V-7', 60]],
      },
    ] satisfies SheetWithoutTopRows[]).map(withTopRows),
    suggestions: {
      Plants: suggestion({
        sheetName: 'Sites',
        headerRow: 2,
        columns: { plant_code: 'Site ID', plant_name: 'Site', country: 'Land' },
      }),
      Products: suggestion({
        sheetName: 'Products',
        headerRow: 1,
        columns: {
          product_code: 'product_code',
          plant_code: 'plant_code',
          product_name: 'product_name',
          weekly_revenue: 'weekly_revenue',
        },
      }),
      BOM: suggestion({
        sheetName: 'BOM',
        headerRow: 1,
        columns: { parent_code: 'parent_code', child_code: 'child_code', qty_per: 'qty_per' },
      }),
      Suppliers: suggestion({
        sheetName: 'Vendors',
        headerRow: 1,
        columns: { supplier_code: 'Vendor no', supplier_name: 'Vendor', country: 'Land' },
        unmatchedHeaders: ['Has plan'],
      }),
      Sourcing: suggestion({
        sheetName: 'Purchases',
        headerRow: 1,
        columns: { supplier_code: 'Vendor no' },
        missingColumns: ['buyer_code', 'item_code'],
        unmatchedHeaders: ['Buyer', 'Part', 'Share'],
      }),
      Stock: suggestion({ isRequired: false }),
    },
    missingSheets: [],
  };
}

/** What POST /api/imports/41/commit answers after a first import replaced version 3. */
export function commitFixture(): ImportCommitDto {
  return {
    id: 41,
    networkVersionId: 4,
    counts: { Plants: 2, Products: 3, BOM: 8, Suppliers: 5, Sourcing: 7 },
    warnings: [],
    changes: {
      previousVersionId: 3,
      suppliersAdded: ['V-7', 'V-9'],
      suppliersRemoved: ['V-2'],
      suppliersChanged: [],
      sourcingAdded: 3,
      sourcingRemoved: 1,
      sourcingChanged: 2,
      productsAdded: [],
      productsRemoved: [],
      productsChanged: ['PR-10'],
    },
  };
}
