import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import type { Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { version } from '../network/network-fixtures';
import { userWithRole } from '../testing/user-fixtures';
import { EVENT_SOURCE_FACTORY, RUN_POLL_INTERVAL_MS } from './run-progress';
import { FakeEventSource, fakeEventSourceFactory, runRow } from './runs-fixtures';
import { RunsPage } from './runs-page';

@Component({ template: 'ranking' })
class RankingStub {}

describe('RunsPage', () => {
  let fixture: ComponentFixture<RunsPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  async function open(role: Role, runs = [runRow(1)]): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    fixture = TestBed.createComponent(RunsPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    const list = backend.expectOne((request) => request.url === '/api/analysis-runs');
    expect(list.request.params.get('limit')).toBe('25');
    expect(list.request.params.get('offset')).toBe('0');
    list.flush({ items: runs, total: runs.length });
    await settle();
  }

  function button(label: string, scope: ParentNode = root): HTMLButtonElement | undefined {
    return [...scope.querySelectorAll<HTMLButtonElement>('button')].find(
      (candidate) => candidate.textContent?.trim().endsWith(label),
    );
  }

  beforeEach(() => {
    FakeEventSource.reset();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([{ path: 'runs/:runId', component: RankingStub }]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: EVENT_SOURCE_FACTORY, useValue: fakeEventSourceFactory },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    fixture.destroy();
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('lists runs with status, who started them and how long they took', async () => {
    await open('viewer', [runRow(4, { label: 'Review Q4' })]);
    const cells = [...root.querySelectorAll('tr.mat-mdc-row td')].map((cell) =>
      cell.textContent?.trim(),
    );
    expect(cells.slice(0, 3)).toEqual(['Review Q4', 'Version 3', 'Finished']);
    expect(cells).toContain('Rania Okafor');
    expect(cells).toContain('2 min 5 s');
    expect(root.querySelector('a[href="/runs/4"]')).not.toBeNull();
  });

  it('offers "Start a run" to risk managers and admins only', async () => {
    await open('viewer');
    expect(button('Start a run')).toBeUndefined();
    fixture.destroy();
    await open('risk_manager');
    expect(button('Start a run')).toBeDefined();
  });

  it('feeds a running run\'s progress bar and stage from its event stream', async () => {
    await open('viewer', [runRow(7, { status: 'running', progress: 0.1, stage: null,
      finishedAt: null })]);
    expect(FakeEventSource.opened.map((source) => source.url)).toEqual([
      '/api/analysis-runs/7/events',
    ]);
    const stream = FakeEventSource.opened[0]!;
    stream.progress({ id: 7, status: 'running', progress: 0.42, stage: 'betweenness',
      error: null });
    await settle();
    const bar = root.querySelector('mat-progress-bar[aria-label="Progress of Review 7"]')!;
    expect(bar.getAttribute('aria-valuenow')).toBe('42');
    expect(root.textContent).toContain('Working on: betweenness · 42%');

    stream.progress({ id: 7, status: 'failed', progress: 0.42, stage: null,
      error: 'The network has no plant.' });
    await settle();
    expect(stream.isClosed).toBe(true);
    // A finished run is read again for its end time.
    backend.expectOne((request) => request.url === '/api/analysis-runs').flush({
      items: [runRow(7, { status: 'failed', error: 'The network has no plant.' })], total: 1,
    });
    await settle();
    expect(root.textContent).toContain('The network has no plant.');
  });

  it('falls back to polling the run every 2 s when the stream fails', async () => {
    await open('viewer', [runRow(7, { status: 'running', progress: 0.1, finishedAt: null })]);
    FakeEventSource.opened[0]!.fail();
    await settle();
    expect(FakeEventSource.opened[0]!.isClosed).toBe(true);
    // The first poll goes out on the next timer turn.
    await new Promise((resolve) => setTimeout(resolve, 10));
    backend.expectOne('/api/analysis-runs/7').flush(
      runRow(7, { status: 'running', progress: 0.8, stage: 'closeness', finishedAt: null }),
    );
    await settle();
    expect(root.textContent).toContain('Working on: closeness · 80%');
    backend.expectNone('/api/analysis-runs/7');
    await new Promise((resolve) => setTimeout(resolve, RUN_POLL_INTERVAL_MS + 50));
    backend.expectOne('/api/analysis-runs/7').flush(runRow(7));
    await settle();
    backend.expectOne((request) => request.url === '/api/analysis-runs').flush({
      items: [runRow(7)], total: 1,
    });
    await settle();
    expect(root.textContent).toContain('Finished');
  }, 10_000);

  it('starts a run from the dialog, then opens its ranking when it succeeds', async () => {
    await open('risk_manager', []);
    button('Start a run')!.click();
    await settle();
    backend.expectOne((request) => request.url === '/api/network-versions').flush({
      items: [version(5, { isLatest: true }), version(4, { isLatest: false })], total: 2,
    });
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    expect(dialog.querySelector('mat-select')?.textContent).toContain('Version 5');
    const label = dialog.querySelector<HTMLInputElement>('input[formcontrolname="label"]')!;
    expect(label.value).toMatch(/^Review \d{1,2} \w{3} \d{4}$/);
    label.value = '  Quarter review  ';
    label.dispatchEvent(new Event('input'));
    button('Start', dialog)!.click();
    await settle();

    const start = backend.expectOne('/api/analysis-runs');
    expect(start.request.method).toBe('POST');
    expect(start.request.body).toEqual({ networkVersionId: 5, label: 'Quarter review' });
    expect(start.request.headers.get('x-keelson-csrf')).toBe('1');
    start.flush({ id: 12 }, { status: 202, statusText: 'Accepted' });
    await settle();

    backend.expectOne((request) => request.url === '/api/analysis-runs').flush({
      items: [runRow(12, { status: 'queued', progress: 0, finishedAt: null, startedAt: null })],
      total: 1,
    });
    await settle();
    expect(root.textContent).toContain('Waiting for the engine');
    const stream = FakeEventSource.opened.find((source) => source.url.includes('/12/'))!;
    stream.progress({ id: 12, status: 'succeeded', progress: 1, stage: null, error: null });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/runs/12');
  });

  it('cancels a running run', async () => {
    await open('admin', [runRow(9, { status: 'running', progress: 0.3, finishedAt: null })]);
    button('Cancel')!.click();
    const cancel = backend.expectOne('/api/analysis-runs/9/cancel');
    expect(cancel.request.method).toBe('POST');
    cancel.flush({});
    await settle();
    backend.expectOne((request) => request.url === '/api/analysis-runs').flush({
      items: [runRow(9, { status: 'cancelled' })], total: 1,
    });
    await settle();
    expect(root.textContent).toContain('Cancelled');
  });

  it('closes the event streams when the page goes away', async () => {
    await open('viewer', [runRow(7, { status: 'running', finishedAt: null })]);
    fixture.destroy();
    expect(FakeEventSource.opened[0]!.isClosed).toBe(true);
  });
});
