import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runRow } from '../runs/runs-fixtures';
import { ComparePage } from './compare-page';
import { comparisonDto, comparisonRow } from './rescoring-fixtures';

function words(node: Element | null | undefined): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('ComparePage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;

  function root(): HTMLElement {
    return harness.routeNativeElement!;
  }

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  async function open(url: string): Promise<void> {
    harness = await RouterTestingHarness.create(url);
    await settle();
    backend.expectOne((request) => request.url === '/api/analysis-runs').flush({
      items: [runRow(102, { label: 'Quarterly 2026-Q4', kind: 'quarterly' }),
        runRow(101, { label: 'Quarterly 2026-Q3', kind: 'quarterly' }),
        runRow(100, { label: 'Supplier review' }), runRow(99, { status: 'failed' })],
      total: 4,
    });
  }

  function section(key: string): HTMLElement {
    return root().querySelector<HTMLElement>(
      `kl-comparison-section:has(#section-${key})`)!;
  }

  function sectionRows(key: string): string[][] {
    return [...section(key).querySelectorAll('tr.mat-mdc-row')].map((row) =>
      [...row.querySelectorAll('td')].map((cell) => words(cell)));
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([{ path: 'rescoring/compare', component: ComparePage }],
          withComponentInputBinding()),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('asks for the default comparison and sets the pickers to the runs it chose', async () => {
    await open('/rescoring/compare');
    const request = backend.expectOne((r) => r.url === '/api/comparison');
    expect(request.request.params.keys()).toEqual([]);
    request.flush(comparisonDto());
    await settle();
    const pickers = [...root().querySelectorAll('mat-select')].map((select) => words(select));
    expect(pickers[0]).toContain('Quarterly 2026-Q3 (run 101');
    expect(pickers[1]).toContain('Quarterly 2026-Q4 (run 102');
    expect(words(root().querySelector('header'))).toContain('decision support');
    const exportLink = [...root().querySelectorAll('a')].find((a) =>
      words(a).endsWith('Export to xlsx'));
    expect(exportLink?.getAttribute('href')).toBe('/api/comparison/export.xlsx?from=101&to=102');
  });

  it('shows each section with its count, ratings before and after, and changes', async () => {
    await open('/rescoring/compare?from=101&to=102');
    const request = backend.expectOne((r) => r.url === '/api/comparison');
    expect(request.request.params.get('from')).toBe('101');
    expect(request.request.params.get('to')).toBe('102');
    request.flush(comparisonDto());
    await settle();
    const titles = [...root().querySelectorAll('kl-comparison-section h2')].map((h) => words(h));
    expect(titles).toEqual([
      'New single points of failure 1', 'Single points of failure that went away 0',
      'Biggest risers 2', 'Biggest fallers 1', 'Suppliers added 1', 'Suppliers removed 1',
    ]);
    expect(sectionRows('newSinglePoints')).toEqual([[
      'Tarnwick Alloys S-2-SHARED-C', '2', '◐ 10 Medium', '● 15 High', '+5', '200,000',
      '260,000', '+60,000',
    ]]);
    expect(sectionRows('goneSinglePoints')).toEqual([['None went away.']]);
    expect(sectionRows('suppliersAdded')[0]!.slice(2, 4)).toEqual([
      'not in the run', '● 15 High']);
    expect(sectionRows('suppliersRemoved')[0]!.slice(2, 8)).toEqual([
      '◐ 8 Medium', 'not in the run', '−8', '90,000', '—', '−90,000']);
  });

  it('links each supplier to its risk page in the run that has it', async () => {
    await open('/rescoring/compare?from=101&to=102');
    backend.expectOne((r) => r.url === '/api/comparison').flush(comparisonDto());
    await settle();
    const link = (key: string): string | null | undefined =>
      section(key).querySelector('td a')?.getAttribute('href');
    expect(link('newSinglePoints')).toBe('/risk/102/suppliers/S-2-SHARED-C');
    // A removed supplier exists only in the earlier run.
    expect(link('suppliersRemoved')).toBe('/risk/101/suppliers/S-1-0007');
  });

  it('sorts a section by a column', async () => {
    await open('/rescoring/compare?from=101&to=102');
    backend.expectOne((r) => r.url === '/api/comparison').flush(comparisonDto());
    await settle();
    const header = [...section('risers').querySelectorAll<HTMLElement>('th')].find((th) =>
      words(th) === 'Revenue impact change')!;
    header.querySelector<HTMLElement>('.mat-sort-header-container')!.click();
    await settle();
    expect(sectionRows('risers').map((row) => row[0])).toEqual([
      'Tarnwick Alloys S-2-SHARED-C', 'Aldren Pumps S-1-0003']);
    header.querySelector<HTMLElement>('.mat-sort-header-container')!.click();
    await settle();
    expect(sectionRows('risers').map((row) => row[0])).toEqual([
      'Aldren Pumps S-1-0003', 'Tarnwick Alloys S-2-SHARED-C']);
  });

  it('puts a picked run into the URL and compares again', async () => {
    await open('/rescoring/compare');
    backend.expectOne((r) => r.url === '/api/comparison').flush(comparisonDto());
    await settle();
    root().querySelectorAll<HTMLElement>('mat-select .mat-mdc-select-trigger')[0]!.click();
    await settle();
    const option = [...document.querySelectorAll<HTMLElement>('mat-option')].find((o) =>
      words(o).startsWith('Supplier review'))!;
    // A failed run is not offered.
    expect(document.querySelectorAll('mat-option')).toHaveLength(3);
    option.click();
    await settle();
    expect(TestBed.inject(Router).url).toBe('/rescoring/compare?from=100&to=102');
    const again = backend.expectOne((r) => r.url === '/api/comparison');
    expect(again.request.params.get('from')).toBe('100');
    again.flush(comparisonDto({ risers: [], fallers: [comparisonRow('S-1-0003')] }));
    await settle();
    expect(sectionRows('risers')).toEqual([['No supplier rose in rating or revenue impact.']]);
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('says what a comparison needs when the server cannot make one', async () => {
    await open('/rescoring/compare');
    backend.expectOne((r) => r.url === '/api/comparison').flush(
      { error: { code: 'not_found', message: 'There is no second quarterly run to compare.',
        details: null } }, { status: 404, statusText: 'Not Found' });
    await settle();
    expect(words(root().querySelector('[role="alert"]'))).toContain(
      'There is no second quarterly run to compare.');
    expect(words(root())).toContain('A comparison needs two finished runs.');
    expect(root().querySelector('kl-comparison-section')).toBeNull();
  });
});
