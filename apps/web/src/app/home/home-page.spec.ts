import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { DashboardDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { HomePage } from './home-page';

@Component({ template: 'list' })
class ListStub {}

const NONE: DashboardDto = {
  role: 'viewer', hasNetwork: true, openEntriesByBand: null, entriesByStatus: null,
  lastRun: null, lastRescoring: null, plansAwaitingApproval: null, overdueTasks: null,
  myOverdueTasks: null, topRisks: null, lastImport: null,
};

function words(node: Element | null): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('HomePage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  async function open(role: Role, answer: DashboardDto | 'error'): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create('/home');
    root = harness.routeNativeElement!;
    const request = backend.expectOne('/api/dashboard');
    if (answer === 'error') {
      request.flush({ error: { code: 'internal', message: 'The database is locked.' } },
        { status: 500, statusText: 'Server Error' });
    } else {
      request.flush(answer);
    }
    await settle();
  }

  const card = (id: string) => root.querySelector(`[data-card="${id}"]`);
  const linkNamed = (scope: Element | null, name: string) =>
    [...(scope?.querySelectorAll<HTMLAnchorElement>('a') ?? [])]
      .find((anchor) => words(anchor).includes(name) || anchor.getAttribute('aria-label') === name);

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'home', component: HomePage },
          { path: '**', component: ListStub },
        ]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('shows a risk manager the register by band, each count a link to the filtered register',
    async () => {
      await open('risk_manager', { ...NONE, role: 'risk_manager',
        openEntriesByBand: { low: 0, medium: 2, high: 3, critical: 1 },
        entriesByStatus: { open: { low: 0, medium: 1, high: 3, critical: 1 },
          mitigating: { low: 0, medium: 1, high: 0, critical: 0 } },
        lastRun: { id: 7, label: 'Spring review', finishedAt: '2026-03-01T10:00:00.000Z',
          kind: 'manual' },
        plansAwaitingApproval: 2, overdueTasks: 4, myOverdueTasks: 1 });
      expect(words(root)).toContain('scores are decision support');
      const register = card('register');
      expect(words(register)).toContain('5 open entries');
      const high = linkNamed(register, '3 High, open')!;
      expect(high.getAttribute('href')).toBe('/register?ratingBand=high&status=open');
      expect(linkNamed(register, '1 Medium, mitigating')!.getAttribute('href'))
        .toBe('/register?ratingBand=medium&status=mitigating');
      expect(linkNamed(card('approvals'), 'plans waiting for approval')!.getAttribute('href'))
        .toBe('/approvals');
      expect(linkNamed(card('tasks'), 'overdue tasks on all plans')!.getAttribute('href'))
        .toBe('/tasks?whose=everyone&show=overdue');
      expect(linkNamed(card('run'), 'Spring review')!.getAttribute('href')).toBe('/runs/7');
      expect(words(card('rescoring'))).toContain('No quarterly re-scoring yet.');
      high.click();
      await settle();
      expect(TestBed.inject(Router).url).toBe('/register?ratingBand=high&status=open');
    });

  it('shows a plant manager their top risks and what waits for their decision', async () => {
    await open('plant_manager', { ...NONE, role: 'plant_manager',
      openEntriesByBand: { low: 0, medium: 0, high: 1, critical: 0 },
      topRisks: [{ id: 12, title: 'Single source for castings', supplierCode: 'S-2-SHARED-A',
        rating: 12, ratingBand: 'high', plants: ['P-NORTH', 'P-SOUTH'] }],
      plansAwaitingApproval: 1, overdueTasks: 0 });
    expect(words(root)).toContain('Your plants: P-NORTH');
    const risks = card('risks')!;
    expect(words(risks.querySelector('kl-rating-chip'))).toBe('● 12 High');
    expect(words(risks)).toContain('Single source for castings S-2-SHARED-A · P-NORTH, P-SOUTH');
    expect(linkNamed(risks, 'Single source for castings')!.getAttribute('href'))
      .toBe('/register/12');
    expect(linkNamed(card('approvals'), 'plan waiting for you')!.getAttribute('href'))
      .toBe('/approvals');
    expect(card('run')).toBeNull();
  });

  it('shows a buyer the last import, and what to do first when there is none', async () => {
    await open('buyer', { ...NONE, role: 'buyer', hasNetwork: false });
    expect(words(card('network'))).toContain('Import the supplier spreadsheet first.');
    expect(linkNamed(card('network'), 'Import the supplier spreadsheet')!.getAttribute('href'))
      .toBe('/imports');
    expect(card('register')).toBeNull();
  });

  it('tells a viewer to ask a buyer when nothing is imported', async () => {
    await open('viewer', { ...NONE, hasNetwork: false,
      openEntriesByBand: { low: 0, medium: 0, high: 0, critical: 0 } });
    expect(words(card('network')))
      .toContain('ask a buyer to import the supplier spreadsheet');
    expect(linkNamed(card('network'), 'Import')).toBeUndefined();
  });

  it('says when the dashboard cannot be read', async () => {
    await open('viewer', 'error');
    expect(words(root.querySelector('[role="alert"]'))).toContain('The database is locked.');
  });
});
