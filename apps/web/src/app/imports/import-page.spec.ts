import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { ImportBatchDto, ImportMappingDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { batchFixture, commitFixture, inspectionFixture } from './import-fixtures';
import { ImportPage } from './import-page';

const SAVED: ImportMappingDto = {
  id: 3,
  name: 'Harbour ERP export',
  mapping: {},
  headerSignature: 'ab12',
  createdBy: { id: 2, name: 'Bruno Keller' },
  createdAt: '2026-11-20T10:00:00.000Z',
  lastUsedAt: null,
};

describe('ImportPage', () => {
  let fixture: ComponentFixture<ImportPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function button(label: string): HTMLButtonElement {
    const found = [...root.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
      candidate.textContent?.includes(label),
    );
    if (!found) {
      throw new Error(`no button "${label}"`);
    }
    return found;
  }

  function stepTitle(): string {
    return root.querySelector('h2')?.textContent?.trim() ?? '';
  }

  function field<T extends HTMLElement>(id: string): T {
    return root.querySelector<T>(`#${id}`)!;
  }

  async function upload(answer: ImportBatchDto): Promise<void> {
    const picker = root.querySelector<HTMLInputElement>('input[type="file"]')!;
    const file = new File([new Uint8Array(100)], answer.fileName);
    Object.defineProperty(picker, 'files', { value: { length: 1, item: () => file } });
    picker.dispatchEvent(new Event('change'));
    await settle();
    backend.expectOne('/api/imports').flush(answer, { status: 201, statusText: 'Created' });
    await settle();
  }

  function problemsRequest(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/imports/41/problems');
  }

  /** Uploads a file that needs a mapping and answers the mapping step's two requests. */
  async function openMappingStep(): Promise<void> {
    await upload(batchFixture());
    backend.expectOne('/api/import-mappings').flush({ items: [SAVED] });
    backend.expectOne('/api/imports/41/inspection').flush(inspectionFixture());
    await settle();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ImportPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne('/api/imports/limits').flush({ uploadMaxBytes: 5 * 1024 * 1024 });
    await settle();
  });

  afterEach(() => backend.verify());

  it("states the server's upload limit, not the usual default", () => {
    expect(root.textContent).toContain('up to 5 MB');
    expect(root.textContent).not.toContain('20 MB');
  });

  it('starts at the upload step with the later steps closed', () => {
    expect(stepTitle()).toBe('Step 1 of 4: Upload');
    const steps = [...root.querySelectorAll<HTMLButtonElement>('nav button')];
    expect(steps.map((step) => step.disabled)).toEqual([false, true, true, true]);
    expect(steps[0]!.getAttribute('aria-current')).toBe('step');
  });

  it('opens the mapping step with suggestions preselected when a mapping is needed', async () => {
    await openMappingStep();
    expect(stepTitle()).toBe('Step 2 of 4: Map columns');
    expect(field<HTMLSelectElement>('map-plants-sheet').value).toBe('Sites');
    expect(field<HTMLInputElement>('map-plants-header-row').value).toBe('2');
    expect(field<HTMLSelectElement>('map-plants-plant_code').value).toBe('Site ID');
    expect(field<HTMLSelectElement>('map-suppliers-supplier_code').value).toBe('Vendor no');
    expect(field<HTMLSelectElement>('map-sourcing-buyer_code').value).toBe('');
    expect(field('map-sourcing-buyer_code').getAttribute('aria-invalid')).toBe('true');
    expect(root.textContent).toContain('2 required columns have no column of your file yet.');
    const preview = root.querySelector('table[aria-label="First rows of Sites"]')!;
    expect(preview.querySelectorAll('tbody tr')).toHaveLength(2);
    expect(preview.querySelector('td')?.textContent).toBe('HB-1');
  });

  it('posts the chosen mapping to the check and moves on to the check step', async () => {
    await openMappingStep();
    for (const [id, header] of [
      ['map-sourcing-buyer_code', 'Buyer'],
      ['map-sourcing-item_code', 'Part'],
    ] as const) {
      const select = field<HTMLSelectElement>(id);
      select.value = header;
      select.dispatchEvent(new Event('change'));
    }
    await settle();
    button('Check with this mapping').click();
    await settle();
    const check = backend.expectOne('/api/imports/41/check');
    expect(check.request.method).toBe('POST');
    const body = check.request.body as { mapping: Record<string, unknown> };
    expect(body.mapping['Sourcing']).toEqual({
      sheetName: 'Purchases',
      headerRow: 1,
      columns: { supplier_code: 'Vendor no', buyer_code: 'Buyer', item_code: 'Part' },
    });
    expect(body.mapping['Plants']).toEqual({
      sheetName: 'Sites',
      headerRow: 2,
      columns: { plant_code: 'Site ID', plant_name: 'Site', country: 'Land' },
    });
    expect(body.mapping['Stock']).toBeUndefined();
    check.flush(
      batchFixture({
        status: 'ready',
        warningCount: 1,
        counts: { Plants: 2, Products: 3, BOM: 8, Suppliers: 5, Sourcing: 7 },
      }),
    );
    await settle();
    expect(stepTitle()).toBe('Step 3 of 4: Check');
    problemsRequest().flush({ items: [], total: 0 });
    await settle();
    const counts = root.querySelector('table[aria-label="Rows read per template sheet"]')!;
    expect(counts.textContent).toContain('Sourcing');
    expect(counts.querySelectorAll('tbody tr')[4]!.textContent).toContain('7');

    button('Continue to commit').click();
    await settle();
    expect(stepTitle()).toBe('Step 4 of 4: Commit');
    button('Commit as a new network version').click();
    await settle();
    backend
      .expectOne('/api/imports/41/commit')
      .flush(commitFixture(), { status: 201, statusText: 'Created' });
    await settle();
    expect(root.textContent).toContain('Network version 4 is saved');
    expect(root.querySelector('kl-import-status-chip')?.textContent).toContain('Committed');
  });

  it('saves the mapping under a name for the batch', async () => {
    await openMappingStep();
    const name = root.querySelector<HTMLInputElement>('input[name="mappingName"]')!;
    name.value = 'Harbour ERP, November';
    name.dispatchEvent(new Event('input'));
    button('Save mapping as').click();
    await settle();
    const save = backend.expectOne('/api/import-mappings');
    expect(save.request.method).toBe('POST');
    const body = save.request.body as { name: string; batchId: number; mapping: object };
    expect(body.name).toBe('Harbour ERP, November');
    expect(body.batchId).toBe(41);
    expect(Object.keys(body.mapping)).toContain('Suppliers');
    save.flush({ ...SAVED, id: 4, name: 'Harbour ERP, November' }, { status: 201, statusText: '' });
    await settle();
    expect(root.textContent).toContain('Saved as "Harbour ERP, November"');
  });

  it('offers a matching saved mapping and checks the file with it', async () => {
    await upload(
      batchFixture({
        status: 'rejected',
        errorCount: 12,
        suggestedMapping: { id: 3, name: SAVED.name },
      }),
    );
    expect(stepTitle()).toBe('Step 3 of 4: Check');
    problemsRequest().flush({ items: [], total: 12 });
    await settle();
    button(`Use mapping ${SAVED.name}`).click();
    await settle();
    const check = backend.expectOne('/api/imports/41/check');
    expect(check.request.body).toEqual({ mappingId: 3 });
    check.flush(batchFixture({ status: 'ready', mapping: {}, suggestedMapping: null }));
    await settle();
    problemsRequest().flush({ items: [], total: 0 });
    await settle();
    expect(root.textContent).not.toContain('Use mapping');
    expect(root.querySelector('kl-import-status-chip')?.textContent).toContain('Ready to commit');
  });

  it('opens a batch from the history at its check step, and goes back to upload', async () => {
    fixture.componentRef.setInput('batchId', '41');
    await settle();
    backend.expectOne('/api/imports/41').flush(batchFixture({ status: 'rejected', errorCount: 3 }));
    await settle();
    expect(stepTitle()).toBe('Step 3 of 4: Check');
    problemsRequest().flush({ items: [], total: 3 });
    await settle();
    const report = root.querySelector<HTMLAnchorElement>('a[download]')!;
    expect(report.getAttribute('href')).toBe('/api/imports/41/error-report.xlsx');
    expect(root.textContent).toContain('Download error report (xlsx)');
    button('Upload a corrected file').click();
    await settle();
    expect(stepTitle()).toBe('Step 1 of 4: Upload');
    expect(document.activeElement).toBe(root.querySelector('h2'));
  });

  it('shows the error when the batch cannot be opened', async () => {
    fixture.componentRef.setInput('batchId', '99');
    await settle();
    backend.expectOne('/api/imports/99').flush(
      { error: { code: 'not_found', message: 'There is no import 99.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain('There is no import 99.');
  });
});
