import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { ImportMappingDto, WorkbookInspection } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { batchFixture, inspectionFixture } from './import-fixtures';
import { MappingStep } from './mapping-step';

const SAVED: ImportMappingDto = {
  id: 3,
  name: 'Harbour ERP export',
  mapping: {},
  headerSignature: 'ab12',
  createdBy: null,
  createdAt: '2026-11-20T10:00:00.000Z',
  lastUsedAt: null,
};

describe('MappingStep', () => {
  let fixture: ComponentFixture<MappingStep>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function inspectionRequest(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/imports/41/inspection');
  }

  function choose(id: string, value: string): void {
    const select = root.querySelector<HTMLSelectElement>(`#${id}`)!;
    select.value = value;
    select.dispatchEvent(new Event('change'));
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [MappingStep],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MappingStep);
    // The last check mapped buyer_code already; the draft must keep that choice.
    const mapping = { Sourcing: { sheetName: 'Purchases', columns: { buyer_code: 'Buyer' } } };
    fixture.componentRef.setInput('batch', batchFixture({ mapping }));
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne('/api/import-mappings').flush({ items: [SAVED] });
    inspectionRequest().flush(inspectionFixture());
    await settle();
  });

  afterEach(() => backend.verify());

  it("keeps the last check's choices over the suggestions", () => {
    const buyer = root.querySelector<HTMLSelectElement>('#map-sourcing-buyer_code')!;
    expect(buyer.value).toBe('Buyer');
    expect(root.textContent).toContain('1 required column has no column of your file yet.');
  });

  it('opens the sheets that need a look and keeps those found by name closed', async () => {
    const toggles = [...root.querySelectorAll<HTMLButtonElement>('.sheet-card__toggle')];
    expect(toggles.map((toggle) => toggle.getAttribute('aria-expanded'))).toEqual([
      'true', // Plants: read from "Sites", with other headers
      'false', // Products: the template's own names
      'false', // BOM
      'true', // Suppliers: read from "Vendors"
      'true', // Sourcing: required columns missing
      'false', // Stock: not in the file
    ]);
    expect(root.textContent).toContain(
      'Read from the sheet Products, 4 of 4 columns found by name.',
    );
    toggles[1]!.click();
    await settle();
    expect(toggles[1]!.getAttribute('aria-expanded')).toBe('true');
    expect(root.querySelector<HTMLElement>('#map-products-body')!.hidden).toBe(false);
  });

  it('re-fills the fields from the headers when another file sheet is chosen', async () => {
    choose('map-plants-sheet', 'Products');
    await settle();
    expect(root.querySelector<HTMLSelectElement>('#map-plants-plant_code')!.value).toBe(
      'plant_code',
    );
    expect(root.querySelector<HTMLSelectElement>('#map-plants-plant_name')!.value).toBe('');
    expect(root.querySelector('table[aria-label="First rows of Products"]')).not.toBeNull();
  });

  it('previews the row the buyer types as the header row, and says when it is blank', async () => {
    const headerRow = root.querySelector<HTMLInputElement>('#map-plants-header-row')!;
    const previewHeads = () => [...root.querySelectorAll(
      'table[aria-label="First rows of Sites"] th')].map((cell) => cell.textContent!.trim());
    expect(previewHeads()).toEqual(['Site ID', 'Site', 'Land']);
    // Row 3 of "Sites" is its first data row (HB-1): the preview takes it as the headers.
    headerRow.value = '3';
    headerRow.dispatchEvent(new Event('change'));
    await settle();
    expect(previewHeads()).toEqual(['HB-1', 'Harbour Works', 'NL']);
    const options = [...root.querySelectorAll<HTMLOptionElement>('#map-plants-plant_code option')]
      .map((option) => option.value);
    expect(options).toContain('HB-1');
    headerRow.value = '9';
    headerRow.dispatchEvent(new Event('change'));
    await settle();
    expect(root.querySelector('table[aria-label="First rows of Sites"] tbody')!.textContent)
      .toContain('Row 9 is blank');
  });

  it('loads a saved mapping through the inspection and can delete it', async () => {
    choose('mapping-saved', '3');
    await settle();
    const withSaved = inspectionRequest();
    expect(withSaved.request.params.get('mappingId')).toBe('3');
    withSaved.flush(inspectionFixture());
    await settle();
    // The saved mapping replaces the last check's choice.
    expect(root.querySelector<HTMLSelectElement>('#map-sourcing-buyer_code')!.value).toBe('');

    const remove = [...root.querySelectorAll('button')].find((button) =>
      button.textContent?.includes('Delete the saved mapping'),
    )!;
    remove.click();
    await settle();
    const deletion = backend.expectOne('/api/import-mappings/3');
    expect(deletion.request.method).toBe('DELETE');
    deletion.flush(null, { status: 204, statusText: 'No Content' });
    await settle();
    inspectionRequest().flush(inspectionFixture());
    await settle();
    expect(root.textContent).toContain('Deleted the saved mapping "Harbour ERP export".');
    expect(root.querySelector('#mapping-saved')).toBeNull();
  });

  it('lists the errors of a file that cannot be read at all', async () => {
    fixture.componentRef.setInput('batch', batchFixture({ id: 41, status: 'rejected' }));
    await settle();
    const unreadable: WorkbookInspection = {
      ...inspectionFixture(),
      errors: [
        {
          sheet: null,
          row: null,
          column: null,
          value: null,
          message: 'The file is not a workbook Keelson can read.',
        },
      ],
    };
    inspectionRequest().flush(unreadable);
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'The file is not a workbook Keelson can read.',
    );
  });
});
