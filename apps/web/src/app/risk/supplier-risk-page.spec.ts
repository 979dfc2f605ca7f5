import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { entryScore } from '../rescoring/rescoring-fixtures';
import { SUPPLIER_RISK } from './risk-fixtures';
import { ScoreHistoryChart } from './score-history-chart';
import { SupplierRiskPage, surviveRecoverBars } from './supplier-risk-page';

function words(node: Element | null): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('SupplierRiskPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [{ path: 'risk/:runId/suppliers/:code', component: SupplierRiskPage }],
          withComponentInputBinding(),
        ),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create('/risk/12/suppliers/S-2-SHARED-A');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/analysis-runs/12/suppliers/S-2-SHARED-A').flush(SUPPLIER_RISK);
    await settle();
    backend.expectOne('/api/comparison/entries/42/scores').flush([
      entryScore('2026-Q4', 20, { previousRating: 15 }),
      entryScore('2026-Q3', 15, { previousRating: null, revenueImpact: 400_000 }),
    ]);
    await settle();
  });

  afterEach(() => backend.verify());

  it('says why the supplier matters', () => {
    const title = words(root.querySelector('h1'));
    expect(title).toContain('Tarnwick Alloys S-2-SHARED-A');
    expect(words(root.querySelector('h1 .risk__single'))).toBe('Single point of failure');
    expect(words(root.querySelector('.risk__summary'))).toContain(
      '2 products would stop once stock runs out, with 90,000 of revenue per week exposed');
    const facts = Object.fromEntries([...root.querySelectorAll('.risk__facts dt')]
      .map((dt) => [words(dt), words(dt.nextElementSibling)]));
    expect(facts).toMatchObject({
      'Rank in this run': '1', 'Products lost': '2', 'Revenue exposed per week': '90,000',
      'Revenue impact': '540,000', 'Single point of failure': 'Yes', Likelihood: '3 of 5',
      'Impact band': '5 of 5', Rating: '15 high',
    });
  });

  it('explains each of the six measures with its value', () => {
    const rows = [...root.querySelectorAll('table[aria-label="Network measures"] tbody tr')];
    expect(rows.map((row) => words(row.querySelector('th')))).toEqual([
      'Betweenness', 'Degree', 'Closeness', 'Eigenvector', 'PageRank', 'Nexus index',
    ]);
    expect(rows.map((row) => words(row.querySelector('td')))).toEqual([
      '412', '0.0125', '0.3333', '0.0871', '0.0042', '0.6125',
    ]);
    expect(words(rows[0]!.querySelectorAll('td')[1]!)).toContain('Tarnwick Alloys');
  });

  it('feeds the history chart one point per run, oldest first', () => {
    const chart = harness.fixture.debugElement.query(By.directive(ScoreHistoryChart))
      .componentInstance as ScoreHistoryChart;
    const { labels, datasets } = chart.config().data;
    expect(labels).toEqual(['Q3 review', 'Q4 review']);
    expect(datasets.map((set) => [set.label, set.data])).toEqual([
      ['Rating (1-25)', [10, 15]],
      ['Likelihood (1-5)', [2, 3]],
      ['Impact band (1-5)', [5, 5]],
      ['Revenue impact', [300_000, 540_000]],
    ]);
  });

  it('links to the register entry and draws the failure paths', () => {
    const link = [...root.querySelectorAll('a')].find((a) =>
      words(a).includes('Open its register entry'));
    expect(link?.getAttribute('href')).toBe('/register/42');
    expect(root.querySelectorAll('kl-failure-path-picture g.path-picture__node')).toHaveLength(7);
  });

  it('compares time to survive with time to recover per product', () => {
    const rows = [...root.querySelectorAll('.risk__bar-row')].map(words);
    expect(rows).toEqual([
      'F-100 at P-NORTH Survives 4 weeks Recovers in 10 weeks 6 weeks lost',
      'F-200 at P-NORTH Survives 12 weeks Recovers in 10 weeks 0 weeks lost',
    ]);
    // Scaled to the longest bar (12 weeks of cover).
    expect(surviveRecoverBars(SUPPLIER_RISK).map((bar) =>
      [bar.surviveShare, Math.round(bar.recoverShare * 100) / 100])).toEqual([
      [100 / 3, 83.33], [100, 83.33],
    ]);
  });

  it('says what the scores assume and that the company decides', () => {
    expect(words(root)).toContain('no other source raises its share');
    expect(words(root)).toContain('common practice, not a standard');
    expect(words(root)).toContain("your company's own procedures");
  });

  it('shows the register entry\'s rating per quarter, oldest first', () => {
    const quarters = [...root.querySelectorAll('ol[aria-label="Rating per quarter"] li')]
      .map(words);
    expect(quarters).toEqual([
      '2026-Q3 ● 15 High revenue impact 400,000',
      '2026-Q4 ▲ 20 Critical +5 since before revenue impact 540,000',
    ]);
  });

  it('shows no quarterly trend when the entry has no scores yet', async () => {
    await harness.navigateByUrl('/risk/12/suppliers/S-1-0001');
    await settle();
    backend.expectOne('/api/analysis-runs/12/suppliers/S-1-0001').flush(
      { ...SUPPLIER_RISK, code: 'S-1-0001', registerEntryId: 43 });
    await settle();
    backend.expectOne('/api/comparison/entries/43/scores').flush([]);
    await settle();
    expect(root.querySelector('kl-entry-quarter-trend')?.children).toHaveLength(0);
    expect(words(root)).not.toContain('Per quarter');
  });
});
