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
import type { ImportProblemDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { batchFixture } from './import-fixtures';
import { PROBLEM_SEARCH_DEBOUNCE_MS, ProblemsTable } from './problems-table';

const PROBLEMS: ImportProblemDto[] = [
  {
    kind: 'error',
    sheet: 'Sourcing',
    row: 7,
    column: 'supplier_code',
    value: 'V-99',
    message: 'V-99 is not a supplier_code of the Suppliers sheet.',
    cell: 'C7',
  },
  {
    kind: 'warning',
    sheet: 'Suppliers',
    row: null,
    column: null,
    value: null,
    message: 'Supplier V-3 sells nothing.',
    cell: null,
  },
];

describe('ProblemsTable', () => {
  let fixture: ComponentFixture<ProblemsTable>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function nextRequest(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/imports/41/problems');
  }

  async function answer(items: ImportProblemDto[], total = items.length): Promise<void> {
    nextRequest().flush({ items, total });
    await settle();
  }

  function choose(id: string, value: string): void {
    const select = root.querySelector<HTMLSelectElement>(`#${id}`)!;
    select.value = value;
    select.dispatchEvent(new Event('change'));
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ProblemsTable],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ProblemsTable);
    fixture.componentRef.setInput('batch', batchFixture({ status: 'rejected', errorCount: 1 }));
    root = fixture.nativeElement as HTMLElement;
    await settle();
  });

  afterEach(() => backend.verify());

  it('asks for the first page in the server order and renders the rows', async () => {
    const first = nextRequest();
    expect(first.request.params.toString()).toBe('limit=25&offset=0');
    first.flush({ items: PROBLEMS, total: 2 });
    await settle();
    const cells = [...root.querySelectorAll('tr.mat-mdc-row')[0]!.querySelectorAll('td')].map(
      (cell) => cell.textContent?.trim(),
    );
    expect(cells).toEqual([
      'Error',
      'Sourcing',
      '7 (C7)',
      'supplier_code',
      'V-99',
      'V-99 is not a supplier_code of the Suppliers sheet.',
    ]);
  });

  it('sorts on the server by the clicked column, ascending then descending', async () => {
    await answer(PROBLEMS);
    const rowHeader = [...root.querySelectorAll<HTMLElement>('th[mat-sort-header]')].find(
      (header) => header.textContent?.includes('Row'),
    )!;
    rowHeader.click();
    await settle();
    const ascending = nextRequest();
    expect(ascending.request.params.get('sort')).toBe('row');
    expect(ascending.request.params.get('order')).toBe('asc');
    ascending.flush({ items: PROBLEMS, total: 2 });
    await settle();
    rowHeader.click();
    await settle();
    const descending = nextRequest();
    expect(descending.request.params.get('sort')).toBe('row');
    expect(descending.request.params.get('order')).toBe('desc');
    descending.flush({ items: PROBLEMS, total: 2 });
  });

  it('filters by kind and sheet from the first page', async () => {
    await answer(PROBLEMS, 120);
    root.querySelector<HTMLButtonElement>('.mat-mdc-paginator-navigation-next')!.click();
    await settle();
    expect(nextRequest().request.params.get('offset')).toBe('25');
    choose('problems-kind', 'error');
    await settle();
    const byKind = nextRequest();
    expect(byKind.request.params.get('kind')).toBe('error');
    expect(byKind.request.params.get('offset')).toBe('0');
    byKind.flush({ items: [PROBLEMS[0]], total: 1 });
    await settle();
    choose('problems-sheet', 'Sourcing');
    await settle();
    const bySheet = nextRequest();
    expect(bySheet.request.params.toString()).toBe(
      'limit=25&offset=0&kind=error&sheet=Sourcing',
    );
    bySheet.flush({ items: [PROBLEMS[0]], total: 1 });
  });

  it('searches once the typing settles', async () => {
    await answer(PROBLEMS);
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    for (const text of ['V', 'V-', 'V-99 ']) {
      input.value = text;
      input.dispatchEvent(new Event('input'));
    }
    await settle();
    backend.expectNone((request) => request.url === '/api/imports/41/problems');
    await new Promise((resolve) => setTimeout(resolve, PROBLEM_SEARCH_DEBOUNCE_MS + 50));
    await settle();
    const search = nextRequest();
    expect(search.request.params.get('q')).toBe('V-99');
    search.flush({ items: [], total: 0 });
    await settle();
    expect(root.textContent).toContain('No error or warning matches this filter.');
  });

  it('asks again, keeping the filters, when the batch is checked again', async () => {
    await answer(PROBLEMS);
    choose('problems-kind', 'warning');
    await settle();
    nextRequest().flush({ items: [PROBLEMS[1]], total: 1 });
    fixture.componentRef.setInput('batch', batchFixture({ status: 'ready', warningCount: 1 }));
    await settle();
    expect(nextRequest().request.params.get('kind')).toBe('warning');
  });

  it('says so when the file has no problems at all', async () => {
    await answer([]);
    expect(root.textContent).toContain('No errors and no warnings');
  });

  it('shows the API error when the problems cannot be read', async () => {
    nextRequest().flush(
      { error: { code: 'not_found', message: 'There is no import 41.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain('There is no import 41.');
  });
});
