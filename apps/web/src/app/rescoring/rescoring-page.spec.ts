import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { By } from '@angular/platform-browser';
import { provideRouter } from '@angular/router';
import type { QuarterTrendDto, RescoringRunDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { version } from '../network/network-fixtures';
import { EVENT_SOURCE_FACTORY } from '../runs/run-progress';
import { FakeEventSource, fakeEventSourceFactory } from '../runs/runs-fixtures';
import { userWithRole } from '../testing/user-fixtures';
import { QuarterTrendsChart } from './quarter-trends-chart';
import { quarterOf } from './rescoring-labels';
import { rescoringRow, scheduleDto, trendRow } from './rescoring-fixtures';
import { RescoringPage } from './rescoring-page';

function words(node: Element | null | undefined): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('RescoringPage', () => {
  let fixture: ComponentFixture<RescoringPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function flushList(items: RescoringRunDto[]): void {
    backend.expectOne((request) => request.url === '/api/rescoring')
      .flush({ items, total: items.length });
  }

  async function open(role: Role, items: RescoringRunDto[] = [rescoringRow(1)],
    trends: QuarterTrendDto[] = [trendRow('2026-Q4')]): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    fixture = TestBed.createComponent(RescoringPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    flushList(items);
    backend.expectOne('/api/rescoring/schedule').flush(scheduleDto());
    backend.expectOne('/api/comparison/trends').flush({ items: trends });
    await settle();
  }

  function button(label: string, scope: ParentNode = root): HTMLButtonElement | undefined {
    return [...scope.querySelectorAll<HTMLButtonElement>('button')].find(
      (candidate) => words(candidate).endsWith(label),
    );
  }

  function rows(): string[][] {
    return [...root.querySelectorAll('tr.mat-mdc-row')].map((row) =>
      [...row.querySelectorAll('td')].map((cell) => words(cell)));
  }

  function dialog(): HTMLElement {
    return document.querySelector<HTMLElement>('mat-dialog-container')!;
  }

  beforeEach(() => {
    FakeEventSource.reset();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
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

  it('says what it does, that scores are decision support, and the schedule in words', async () => {
    await open('viewer');
    expect(words(root.querySelector('header'))).toContain('decision support');
    const schedule = words(root.querySelector('kl-rescoring-schedule'));
    expect(schedule).toContain(
      '06:00 on the first Monday of January, April, July and October (Europe/Berlin time)');
    // 05:00 UTC on 4 January 2027 is 06:00 in Berlin.
    expect(schedule).toMatch(/Next run: Monday,? 4 January 2027,? (at )?06:00\./);
    expect(button('Change the schedule')).toBeUndefined();
  });

  it('lists re-scorings with status, attempts, what changed and a link to compare', async () => {
    await open('viewer', [
      rescoringRow(2, { attempts: 2, summary: { ...rescoringRow(2).summary!,
        previousRescoringId: 1 } }),
      rescoringRow(1, { quarterLabel: '2026-Q3', trigger: 'schedule', startedBy: null }),
    ]);
    const [latest, earlier] = rows();
    expect(latest!.slice(0, 5)).toEqual(['2026-Q4 Version 3', 'Finished', 'Its analysis run',
      '2', '148 re-scored · 1 new · 3 rating changed · 1 supplier gone']);
    expect(latest).toContain('Rania Okafor');
    expect(earlier![0]).toBe('2026-Q3 Version 3 · by schedule');
    expect(earlier).toContain('Schedule');
    const compare = [...root.querySelectorAll('a')].filter((a) =>
      words(a) === 'Compare with the previous quarter');
    // Only the later one has a quarter before it.
    expect(compare.map((a) => a.getAttribute('href'))).toEqual([
      '/rescoring/compare?from=101&to=102',
    ]);
    expect(button('Start re-scoring')).toBeUndefined();
  });

  it('compares a forced second re-scoring with the earlier one of its quarter', async () => {
    await open('viewer', [
      rescoringRow(3, { isForced: true, summary: { ...rescoringRow(3).summary!,
        previousRescoringId: 2 } }),
      rescoringRow(2),
    ]);
    const compare = [...root.querySelectorAll('a')].filter((a) =>
      words(a).startsWith('Compare with'));
    expect(compare.map((a) => [words(a), a.getAttribute('href')])).toEqual([
      ['Compare with the earlier re-scoring', '/rescoring/compare?from=102&to=103'],
    ]);
  });

  it('says what to do first when there is no re-scoring and no trend yet', async () => {
    await open('risk_manager', [], []);
    expect(words(root.querySelector('.rescoring__empty'))).toContain(
      'No re-scoring yet. Start one to score the register');
    expect(words(root.querySelector('kl-quarter-trends-chart'))).toContain(
      'No quarter has finished a re-scoring yet');
  });

  it('feeds the trends chart one point per quarter', async () => {
    await open('viewer', [rescoringRow(1)], [
      trendRow('2026-Q3', { singlePointsOfFailure: 2, highEntries: 4, criticalEntries: 1,
        totalRevenueImpact: 2_000_000 }),
      trendRow('2026-Q4', { singlePointsOfFailure: 3, highEntries: 6, criticalEntries: 2,
        totalRevenueImpact: 2_500_000 }),
    ]);
    const chart = fixture.debugElement.query(By.directive(QuarterTrendsChart))
      .componentInstance as QuarterTrendsChart;
    const { labels, datasets } = chart.config().data;
    expect(labels).toEqual(['2026-Q3', '2026-Q4']);
    expect(datasets.map((set) => [set.label, set.data])).toEqual([
      ['Single points of failure', [2, 3]],
      ['High entries', [4, 6]],
      ['Critical entries', [1, 2]],
      ['Total revenue impact', [2_000_000, 2_500_000]],
    ]);
  });

  it('starts a re-scoring for this quarter on the latest version', async () => {
    await open('risk_manager', []);
    button('Start re-scoring')!.click();
    await settle();
    backend.expectOne((request) => request.url === '/api/network-versions').flush({
      items: [version(5, { isLatest: true }), version(4, { isLatest: false })], total: 2,
    });
    await settle();
    const quarter = dialog().querySelector<HTMLInputElement>(
      'input[formcontrolname="quarterLabel"]')!;
    expect(quarter.value).toBe(quarterOf(new Date(), 'Europe/Berlin'));
    // Risk managers may not force a second one.
    expect(dialog().querySelector('mat-checkbox')).toBeNull();
    quarter.value = '2027-Q1';
    quarter.dispatchEvent(new Event('input'));
    button('Start', dialog())!.click();
    await settle();

    const start = backend.expectOne('/api/rescoring');
    expect(start.request.method).toBe('POST');
    expect(start.request.body).toEqual({ quarterLabel: '2027-Q1', force: false });
    expect(start.request.headers.get('x-keelson-csrf')).toBe('1');
    start.flush(rescoringRow(3, { quarterLabel: '2027-Q1', status: 'queued', progress: 0,
      analysisRunId: null, finishedAt: null }), { status: 202, statusText: 'Accepted' });
    await settle();
    flushList([rescoringRow(3, { quarterLabel: '2027-Q1', status: 'queued', progress: 0,
      analysisRunId: null, finishedAt: null, summary: null })]);
    await settle();
    expect(words(root.querySelector('[role="status"]'))).toBe('Re-scoring of 2027-Q1 started.');
    expect(rows()[0]![2]).toContain('Waiting for the engine · 0%');
  });

  it('refuses a taken quarter with a clear message and a way to the existing one', async () => {
    await open('admin', [rescoringRow(7)]);
    button('Start re-scoring')!.click();
    await settle();
    backend.expectOne((request) => request.url === '/api/network-versions').flush({
      items: [version(5, { isLatest: true })], total: 1 });
    await settle();
    expect(words(dialog())).toContain('Force another for this quarter');
    button('Start', dialog())!.click();
    await settle();
    backend.expectOne('/api/rescoring').flush(
      { error: { code: 'quarter_taken', message: '2026-Q4 has a re-scoring already (7).',
        details: { rescoringId: 7 } } },
      { status: 409, statusText: 'Conflict' });
    await settle();
    expect(words(dialog().querySelector('[role="alert"]'))).toContain(
      '2026-Q4 has a re-scoring already (7).');
    button('See the existing re-scoring', dialog())!.click();
    await settle();
    flushList([rescoringRow(7)]);
    await settle();
    const row = root.querySelector('#rescoring-7');
    expect(row?.classList).toContain('rescoring__row--highlighted');
  });

  it('lets an admin force another re-scoring of a quarter', async () => {
    await open('admin', []);
    button('Start re-scoring')!.click();
    await settle();
    backend.expectOne((request) => request.url === '/api/network-versions').flush({
      items: [version(5, { isLatest: true })], total: 1 });
    await settle();
    dialog().querySelector<HTMLInputElement>('mat-checkbox input')!.click();
    button('Start', dialog())!.click();
    await settle();
    const start = backend.expectOne('/api/rescoring');
    expect(start.request.body.force).toBe(true);
    start.flush(rescoringRow(8, { isForced: true }));
    await settle();
    flushList([rescoringRow(8, { isForced: true })]);
    await settle();
    expect(rows()[0]![0]).toBe('2026-Q4 Version 3 · forced');
  });

  it('resumes and restarts an interrupted re-scoring', async () => {
    const interrupted = rescoringRow(4, { status: 'interrupted', finishedAt: null,
      summary: null });
    await open('risk_manager', [interrupted]);
    expect(rows()[0]![1]).toContain('Interrupted The server stopped during it');
    button('Resume')!.click();
    const resume = backend.expectOne('/api/rescoring/4/resume');
    expect(resume.request.body).toEqual({ mode: 'resume' });
    resume.flush(rescoringRow(4, { status: 'succeeded' }));
    await settle();
    flushList([interrupted]);
    await settle();
    button('Restart')!.click();
    const restart = backend.expectOne('/api/rescoring/4/resume');
    expect(restart.request.body).toEqual({ mode: 'restart' });
    restart.flush({ error: { code: 'conflict', message: 'No network version to restart on.',
      details: null } }, { status: 409, statusText: 'Conflict' });
    await settle();
    expect(words(root.querySelector('[role="alert"]'))).toContain(
      'No network version to restart on.');
  });

  it('follows a running re-scoring through its analysis run\'s events', async () => {
    await open('viewer', [rescoringRow(5, { status: 'running', progress: 0.1,
      analysisRunId: 55, finishedAt: null, summary: null })]);
    expect(FakeEventSource.opened.map((source) => source.url)).toEqual([
      '/api/analysis-runs/55/events',
    ]);
    const stream = FakeEventSource.opened[0]!;
    stream.progress({ id: 55, status: 'running', progress: 0.6, stage: 'closeness',
      error: null });
    await settle();
    const bar = root.querySelector('mat-progress-bar[aria-label="Progress of 2026-Q4"]')!;
    expect(bar.getAttribute('aria-valuenow')).toBe('60');
    expect(rows()[0]![2]).toContain('Working on: closeness · 60%');
    stream.progress({ id: 55, status: 'succeeded', progress: 1, stage: null, error: null });
    await settle();
    expect(stream.isClosed).toBe(true);
    flushList([rescoringRow(5)]);
    await settle();
    // It ended: the quarters' totals are read again.
    backend.expectOne('/api/comparison/trends').flush({ items: [] });
    await settle();
    expect(rows()[0]![1]).toBe('Finished');
    expect(words(root.querySelector('kl-quarter-trends-chart'))).toContain(
      'No quarter has finished a re-scoring yet');
  });

  it('lets an admin change the schedule and shows a refused expression under its field',
    async () => {
      await open('admin');
      button('Change the schedule')!.click();
      await settle();
      const cron = root.querySelector<HTMLInputElement>('input[formcontrolname="cron"]')!;
      expect(cron.value).toBe('0 6 * 1,4,7,10 1#1');
      cron.value = '0 25 * * 1';
      cron.dispatchEvent(new Event('input'));
      await settle();
      button('Save schedule')!.click();
      const save = backend.expectOne('/api/rescoring/schedule');
      expect(save.request.method).toBe('PUT');
      expect(save.request.body).toEqual({ cron: '0 25 * * 1', timeZone: 'Europe/Berlin',
        isEnabled: true });
      save.flush({ error: { code: 'validation_failed',
        message: 'body.cron: "0 25 * * 1" is not a valid cron expression.', details: null } },
      { status: 400, statusText: 'Bad Request' });
      await settle();
      expect(words(root.querySelector('kl-rescoring-schedule mat-error'))).toBe(
        'body.cron: "0 25 * * 1" is not a valid cron expression.');

      cron.value = '0 7 * * 1';
      cron.dispatchEvent(new Event('input'));
      await settle();
      button('Save schedule')!.click();
      backend.expectOne('/api/rescoring/schedule').flush(scheduleDto({ cron: '0 7 * * 1',
        nextRunAt: '2026-12-07T06:00:00.000Z' }));
      await settle();
      expect(words(root.querySelector('kl-rescoring-schedule'))).toContain(
        '07:00 every Monday (Europe/Berlin time)');
      expect(words(root.querySelector('[role="status"]'))).toBe('Schedule saved.');
    });
});
