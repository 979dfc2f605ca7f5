import { describe, expect, it } from 'vitest';
import { inspectionFixture } from './import-fixtures';
import {
  draftFromInspection,
  missingFields,
  toWorkbookMapping,
  withColumn,
  withFileSheet,
} from './mapping-draft';

describe('draftFromInspection', () => {
  it('starts from the suggested sheet, header row and columns of every template sheet', () => {
    const draft = draftFromInspection(inspectionFixture());
    expect(draft.Plants).toEqual({
      sheetName: 'Sites',
      headerRow: 2,
      columns: { plant_code: 'Site ID', plant_name: 'Site', country: 'Land' },
    });
    expect(draft.Stock).toEqual({ sheetName: null, headerRow: null, columns: {} });
  });

  it('lays the mapping of the last check over the suggestions', () => {
    const draft = draftFromInspection(inspectionFixture(), {
      Sourcing: { sheetName: 'Purchases', columns: { buyer_code: 'Buyer' } },
    });
    expect(draft.Sourcing.columns).toEqual({ supplier_code: 'Vendor no', buyer_code: 'Buyer' });
    expect(draft.Sourcing.headerRow).toBe(1);
  });
});

describe('missingFields', () => {
  it('names the required fields that have no header yet', () => {
    const draft = draftFromInspection(inspectionFixture());
    expect(missingFields(draft, 'Sourcing')).toEqual(['buyer_code', 'item_code']);
    expect(missingFields(withColumn(draft, 'Sourcing', 'item_code', 'Part'), 'Sourcing')).toEqual(
      ['buyer_code'],
    );
  });
});

describe('withFileSheet', () => {
  it('takes the headers that spell a field name when another sheet is chosen', () => {
    const inspection = inspectionFixture();
    const draft = withFileSheet(draftFromInspection(inspection), 'Plants', 'Products', inspection);
    expect(draft.Plants).toEqual({
      sheetName: 'Products',
      headerRow: 1,
      columns: { plant_code: 'plant_code' },
    });
  });

  it('brings back the suggestions when the suggested sheet is chosen again', () => {
    const inspection = inspectionFixture();
    const away = withFileSheet(draftFromInspection(inspection), 'Plants', null, inspection);
    expect(away.Plants.columns).toEqual({});
    const back = withFileSheet(away, 'Plants', 'Sites', inspection);
    expect(back.Plants.columns['plant_code']).toBe('Site ID');
    expect(back.Plants.headerRow).toBe(2);
  });
});

describe('toWorkbookMapping', () => {
  it('sends chosen sheets only, and leaves out cleared columns', () => {
    let draft = draftFromInspection(inspectionFixture());
    draft = withColumn(draft, 'Suppliers', 'country', '');
    const mapping = toWorkbookMapping(draft);
    expect(Object.keys(mapping)).toEqual(['Plants', 'Products', 'BOM', 'Suppliers', 'Sourcing']);
    expect(mapping.Suppliers).toEqual({
      sheetName: 'Vendors',
      headerRow: 1,
      columns: { supplier_code: 'Vendor no', supplier_name: 'Vendor' },
    });
  });
});
