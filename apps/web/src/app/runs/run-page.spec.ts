import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { AnalysisRunDto, HeatMapDto } from '@keelson/contracts';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { COUNTRIES, PLANTS } from '../network/network-fixtures';
import { RunPage } from './run-page';
import { EVENT_SOURCE_FACTORY } from './run-progress';
import { FakeEventSource, fakeEventSourceFactory, rankingRow, runRow } from './runs-fixtures';

@Component({ template: 'supplier risk' })
class SupplierRiskStub {}

/** 1 supplier at (likelihood 4, band 5), 3 at (2, 2), 2 at (4, 4). */
const HEAT_MAP: HeatMapDto = {
  cells: [
    [0, 0, 0, 0, 0],
    [0, 3, 0, 0, 0],
    [0, 0, 0, 0, 0],
    [0, 0, 0, 2, 1],
    [0, 0, 0, 0, 0],
  ],
  total: 6,
};

const ROWS = [
  rankingRow('S-2-SHARED-A'),
  rankingRow('S-1-0004', { rank: 2, name: 'Halden Gears', tier: 1, singlePointOfFailure: false,
    rating: 6, ratingBand: 'medium', likelihood: 2, impactBand: 3 }),
];

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

describe('RunPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectRanking(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/analysis-runs/5/suppliers');
  }

  /** Opens the run page and answers everything but the ranking, which it returns. */
  async function open(url: string, run: AnalysisRunDto = runRow(5)): Promise<TestRequest> {
    harness = await RouterTestingHarness.create(url);
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/analysis-runs/5').flush(run);
    backend.expectOne('/api/analysis-runs/5/heat-map').flush(HEAT_MAP);
    backend.expectOne('/api/analysis-runs/5/pareto').flush({ items: [], totalRevenueImpact: 0 });
    backend.expectOne('/api/settings/scoring').flush({
      ...SCORING_DEFAULTS,
      ratingBandFloors: { medium: 4, high: 8, critical: 16 },
    });
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    backend.expectOne('/api/countries').flush(COUNTRIES);
    return expectRanking();
  }

  async function showTab(label: string): Promise<void> {
    [...root.querySelectorAll<HTMLElement>('[role="tab"]')]
      .find((tab) => tab.textContent?.includes(label))!
      .click();
    await settle();
  }

  beforeEach(() => {
    FakeEventSource.reset();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'runs/:runId', component: RunPage },
          { path: 'risk/:runId/suppliers/:code', component: SupplierRiskStub },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: EVENT_SOURCE_FACTORY, useValue: fakeEventSourceFactory },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('asks for the first page by rank and links each row to the supplier risk page', async () => {
    const first = await open('/runs/5');
    expect(params(first)).toEqual({ sort: 'rank', order: 'asc', limit: '25', offset: '0' });
    first.flush({ items: ROWS, total: 148 });
    await settle();

    const rows = [...root.querySelectorAll('tr.mat-mdc-row')];
    expect(rows).toHaveLength(2);
    const cells = [...rows[0]!.querySelectorAll('td')].map((cell) =>
      cell.textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(cells).toEqual([
      '1', 'S-2-SHARED-A Orvik Castings single point', '2', 'DE', '2', '84,000', '504,000',
      '0.432', '0.61', '4', '5', '20 · Critical',
    ]);
    expect(rows[0]!.querySelector('.kl-band--critical')).not.toBeNull();
    expect(rows[1]!.querySelector('.kl-band--medium')).not.toBeNull();
    expect(rows[0]!.querySelector('a')?.getAttribute('href')).toBe(
      '/risk/5/suppliers/S-2-SHARED-A',
    );
    expect(root.querySelector('[data-testid="run-summary"]')?.textContent?.replace(/\s+/g, ' '))
      .toContain('148 suppliers · 9 single points of failure · closeness computed exactly');
    expect(root.querySelector('.mat-mdc-paginator-range-label')?.textContent).toContain('148');
    expect(root.textContent).toContain('What the columns mean');
  });

  it('says how closeness was sampled and with what error', async () => {
    const run = runRow(5, { methods: { closeness: { method: 'sampled', pivots: 256, seed: 7,
      maxRelativeStandardError: 0.0123, medianRelativeStandardError: 0.004 } } });
    (await open('/runs/5', run)).flush({ items: [], total: 0 });
    await settle();
    expect(root.querySelector('[data-testid="run-summary"]')?.textContent?.replace(/\s+/g, ' '))
      .toContain('closeness estimated from 256 sampled pivot nodes (relative error up to 1.23%');
  });

  it('sends every filter, the sort and the page from the URL', async () => {
    const request = await open(
      '/runs/5?q=orv&plant=P-NORTH&tier=2&country=DE&region=Europe&ratingBand=high' +
        '&singlePointsOnly=true&sort=revenueImpact&order=desc&limit=50&offset=50',
    );
    expect(params(request)).toEqual({
      q: 'orv', plant: 'P-NORTH', tier: '2', country: 'DE', region: 'Europe',
      ratingBand: 'high', singlePointsOnly: 'true', sort: 'revenueImpact', order: 'desc',
      limit: '50', offset: '50',
    });
    request.flush({ items: ROWS, total: 120 });
    await settle();
    const exportLink = [...root.querySelectorAll('a')].find((link) =>
      link.textContent?.includes('Export the ranking'),
    )!;
    // The export carries the screen's filters and sort, not its page.
    const href = new URL(exportLink.getAttribute('href')!, 'http://keelson.test');
    expect(href.pathname).toBe('/api/analysis-runs/5/export.xlsx');
    expect(Object.fromEntries(href.searchParams)).toEqual({
      q: 'orv', plant: 'P-NORTH', tier: '2', country: 'DE', region: 'Europe',
      ratingBand: 'high', singlePointsOnly: 'true', sort: 'revenueImpact', order: 'desc',
    });
  });

  it('sorts on the server by a clicked column and pages with the paginator', async () => {
    (await open('/runs/5')).flush({ items: ROWS, total: 148 });
    await settle();
    [...root.querySelectorAll<HTMLElement>('th')]
      .find((cell) => cell.textContent?.includes('Nexus index'))!
      .click();
    await settle();
    const byNexus = expectRanking();
    expect(params(byNexus)).toMatchObject({ sort: 'nexusIndex', order: 'asc', offset: '0' });
    byNexus.flush({ items: ROWS, total: 148 });
    await settle();
    root.querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-next')!.click();
    await settle();
    const next = expectRanking();
    expect(params(next)).toEqual({ sort: 'nexusIndex', order: 'asc', limit: '25', offset: '25' });
    next.flush({ items: ROWS, total: 148 });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/runs/5?sort=nexusIndex&order=asc&offset=25');
  });

  it('filters to single points of failure with the toggle', async () => {
    (await open('/runs/5')).flush({ items: ROWS, total: 148 });
    await settle();
    root.querySelector<HTMLButtonElement>('mat-slide-toggle button')!.click();
    await settle();
    const request = expectRanking();
    expect(params(request)).toMatchObject({ singlePointsOnly: 'true', offset: '0' });
    request.flush({ items: [ROWS[0]], total: 9 });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/runs/5?singlePointsOnly=true');
  });

  it('draws the heat map with counts, coloured by the band floors in force', async () => {
    (await open('/runs/5')).flush({ items: ROWS, total: 148 });
    await showTab('Heat map');
    const cells = [...root.querySelectorAll<HTMLButtonElement>('button.heat-map__cell')];
    expect(cells).toHaveLength(25);
    // Top row is likelihood 5; its first cell is impact band 1.
    expect(cells[0]!.dataset['cell']).toBe('5-1');
    const cell = (key: string): HTMLButtonElement =>
      cells.find((candidate) => candidate.dataset['cell'] === key)!;
    expect(cell('4-4').querySelector('.heat-map__count')?.textContent).toBe('2');
    expect(cell('2-2').querySelector('.heat-map__count')?.textContent).toBe('3');
    // Floors 4 / 8 / 16 from the settings: 16 is critical, 15 high, 4 medium, 3 low.
    expect(cell('4-4').classList).toContain('kl-band--critical');
    expect(cell('5-3').classList).toContain('kl-band--high');
    expect(cell('2-2').classList).toContain('kl-band--medium');
    expect(cell('1-3').classList).toContain('kl-band--low');
    expect(cell('4-5').getAttribute('aria-label')).toBe(
      'Likelihood 4, impact band 5: 1 supplier, rating 20 (critical). Show them in the ranking.',
    );
    expect(root.textContent).toContain('These bands are common practice, not a standard');
  });

  it('narrows the ranking to a chosen heat-map cell, with a removable chip', async () => {
    (await open('/runs/5?offset=25')).flush({ items: ROWS, total: 148 });
    await showTab('Heat map');
    root.querySelector<HTMLButtonElement>('button[data-cell="4-5"]')!.click();
    await settle();
    const narrowed = expectRanking();
    expect(params(narrowed)).toEqual({ likelihood: '4', impactBand: '5', sort: 'rank',
      order: 'asc', limit: '25', offset: '0' });
    narrowed.flush({ items: [ROWS[0]], total: 1 });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/runs/5?likelihood=4&impactBand=5');
    expect(root.querySelector('[role="tab"][aria-selected="true"]')?.textContent)
      .toContain('Ranking');
    const chip = root.querySelector<HTMLElement>('mat-chip-row')!;
    expect(chip.textContent).toContain('Likelihood 4 × impact band 5');

    chip.querySelector<HTMLButtonElement>('button[matChipRemove]')!.click();
    await settle();
    const cleared = expectRanking();
    expect(params(cleared)).toEqual({ sort: 'rank', order: 'asc', limit: '25', offset: '0' });
    cleared.flush({ items: ROWS, total: 148 });
    await settle();
    expect(root.querySelector('mat-chip-row')).toBeNull();
  });

  it('shows no results for a run that has not succeeded', async () => {
    harness = await RouterTestingHarness.create('/runs/5');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/analysis-runs/5').flush(
      runRow(5, { status: 'failed', error: 'The engine ran out of memory.' }),
    );
    backend.expectOne('/api/analysis-runs/5/heat-map').flush(
      { error: { code: 'run_not_ready', message: 'Run 5 has no results.' } },
      { status: 409, statusText: 'Conflict' },
    );
    backend.expectOne('/api/analysis-runs/5/pareto').flush(
      { error: { code: 'run_not_ready', message: 'Run 5 has no results.' } },
      { status: 409, statusText: 'Conflict' },
    );
    backend.expectOne('/api/settings/scoring').flush(SCORING_DEFAULTS);
    await settle();
    expect(root.textContent).toContain('The engine ran out of memory.');
    expect(root.textContent).toContain('This run has no results;');
    expect(root.querySelector('kl-run-ranking')).toBeNull();
  });

  it('follows a running run and shows its results once it succeeds', async () => {
    harness = await RouterTestingHarness.create('/runs/5');
    root = harness.routeNativeElement!;
    await settle();
    const notReady = {
      error: { code: 'run_not_ready', message: 'Run 5 has not finished.' },
    };
    backend.expectOne('/api/analysis-runs/5').flush(
      runRow(5, { status: 'running', progress: 0.25, stage: 'single removals', finishedAt: null }),
    );
    backend.expectOne('/api/analysis-runs/5/heat-map').flush(notReady,
      { status: 409, statusText: 'Conflict' });
    backend.expectOne('/api/analysis-runs/5/pareto').flush(notReady,
      { status: 409, statusText: 'Conflict' });
    backend.expectOne('/api/settings/scoring').flush(SCORING_DEFAULTS);
    await settle();
    expect(root.querySelector('[role="status"]')?.textContent).toContain(
      'Working on: single removals · 25%',
    );
    const stream = FakeEventSource.opened[0]!;
    expect(stream.url).toBe('/api/analysis-runs/5/events');
    stream.progress({ id: 5, status: 'running', progress: 0.6, stage: 'betweenness',
      error: null });
    await settle();
    expect(root.querySelector('mat-progress-bar')?.getAttribute('aria-valuenow')).toBe('60');

    stream.progress({ id: 5, status: 'succeeded', progress: 1, stage: null, error: null });
    await settle();
    expect(stream.isClosed).toBe(true);
    backend.expectOne('/api/analysis-runs/5').flush(runRow(5));
    backend.expectOne('/api/analysis-runs/5/heat-map').flush(HEAT_MAP);
    backend.expectOne('/api/analysis-runs/5/pareto').flush({ items: [], totalRevenueImpact: 0 });
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    backend.expectOne('/api/countries').flush(COUNTRIES);
    expectRanking().flush({ items: ROWS, total: 148 });
    await settle();
    expect(root.querySelectorAll('tr.mat-mdc-row')).toHaveLength(2);
  });
});
