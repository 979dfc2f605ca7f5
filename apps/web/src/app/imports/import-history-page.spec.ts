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
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { batchFixture } from './import-fixtures';
import { ImportHistoryPage } from './import-history-page';

const BATCHES = [
  batchFixture({ id: 43, status: 'committed', networkVersionId: 5, warningCount: 2 }),
  batchFixture({ id: 42, status: 'rejected', fileName: 'purchases.csv', errorCount: 17 }),
  batchFixture({ id: 41, createdBy: null }),
];

describe('ImportHistoryPage', () => {
  let fixture: ComponentFixture<ImportHistoryPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function listRequest(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/imports');
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ImportHistoryPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportHistoryPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    const first = listRequest();
    expect(first.request.params.toString()).toBe('limit=25&offset=0');
    first.flush({ items: BATCHES, total: 60 });
    await settle();
  });

  afterEach(() => backend.verify());

  it('shows who uploaded which file, its status, problems and version, linking each batch', () => {
    const rows = [...root.querySelectorAll('tr.mat-mdc-row')];
    expect(rows).toHaveLength(3);
    const cells = (index: number): string[] =>
      [...rows[index]!.querySelectorAll('td')].map((cell) => cell.textContent?.trim() ?? '');
    expect(cells(0).slice(1)).toEqual([
      'Bruno Keller',
      'harbour-network.xlsx',
      '47 KB',
      'Committed',
      '0',
      '2',
      'Version 5',
    ]);
    expect(cells(1)[4]).toBe('Has errors');
    expect(cells(1)[5]).toBe('17');
    expect(cells(2)[1]).toBe('—');
    expect(rows[1]!.querySelector('a')?.getAttribute('href')).toBe('/imports/42');
  });

  it('filters by status from the first page and pages on the server', async () => {
    root.querySelector<HTMLButtonElement>('.mat-mdc-paginator-navigation-next')!.click();
    await settle();
    const second = listRequest();
    expect(second.request.params.get('offset')).toBe('25');
    second.flush({ items: BATCHES, total: 60 });
    await settle();
    const status = root.querySelector<HTMLSelectElement>('#history-status')!;
    status.value = 'rejected';
    status.dispatchEvent(new Event('change'));
    await settle();
    const filtered = listRequest();
    expect(filtered.request.params.toString()).toBe('limit=25&offset=0&status=rejected');
    filtered.flush({ items: [], total: 0 });
    await settle();
    expect(root.textContent).toContain('No import has this status.');
  });
});
