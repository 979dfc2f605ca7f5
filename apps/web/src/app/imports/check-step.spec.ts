import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { ImportBatchDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { CheckStep } from './check-step';
import { batchFixture } from './import-fixtures';
import { UNREADABLE_FILE_HINT } from './import-status';

describe('CheckStep', () => {
  let fixture: ComponentFixture<CheckStep>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  function buttonLabels(): string[] {
    return [...root.querySelectorAll('.check__actions > *')].map(
      (action) => action.textContent?.replace(/^\s*\w+\s+/, '').trim() ?? '',
    );
  }

  async function show(batch: ImportBatchDto): Promise<void> {
    fixture = TestBed.createComponent(CheckStep);
    fixture.componentRef.setInput('batch', batch);
    root = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
    fixture.detectChanges();
    backend
      .expectOne((request) => request.url === `/api/imports/${batch.id}/problems`)
      .flush({ items: [], total: batch.errorCount + batch.warningCount });
    await fixture.whenStable();
    fixture.detectChanges();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [CheckStep],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('counts the rows per template sheet and offers the commit for a ready file', async () => {
    await show(
      batchFixture({
        status: 'ready',
        counts: { Plants: 2, Products: 3, BOM: 8, Suppliers: 5, Sourcing: 7 },
      }),
    );
    const rows = [...root.querySelectorAll('.check__counts tbody tr')].map((row) =>
      [...row.children].map((cell) => cell.textContent?.trim()),
    );
    expect(rows).toEqual([
      ['Plants', '2'],
      ['Products', '3'],
      ['BOM', '8'],
      ['Suppliers', '5'],
      ['Sourcing', '7'],
      ['Stock', 'not in file'],
    ]);
    expect(buttonLabels()).toEqual([
      'Continue to commit',
      'Upload a corrected file',
      'Change the mapping',
    ]);
  });

  it('offers the error report and no commit when the file has errors', async () => {
    await show(batchFixture({ status: 'rejected', errorCount: 5, warningCount: 1 }));
    expect(root.querySelector('.check__errors')?.textContent?.trim()).toBe('5');
    expect(buttonLabels()).toEqual([
      'Download error report (xlsx)',
      'Upload a corrected file',
      'Change the mapping',
    ]);
  });

  it('says a file that is no spreadsheet cannot be read, and offers no mapping', async () => {
    await show(batchFixture({ status: 'rejected', format: null, errorCount: 1, sheets: [] }));
    expect(root.querySelector('.check__status')?.textContent?.trim()).toBe(UNREADABLE_FILE_HINT);
    expect(buttonLabels()).toEqual(['Download error report (xlsx)', 'Upload a corrected file']);
  });
});
