import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { PlanDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { ApprovalsPage } from './approvals-page';
import { planDetail, whatIfResult } from './plan-fixtures';
import { StubPage, button, clearOverlays, plansTestProviders, words } from './plan-spec-helpers';

const WAITING: PlanDto = planDetail(7, {
  status: 'submitted',
  submittedAt: '2026-12-01T10:00:00.000Z',
  pendingPlants: ['P-NORTH', 'P-SOUTH'],
  whatIf: whatIfResult(),
  can: { edit: false, submit: false, withdraw: false, decideFor: ['P-NORTH'] },
});

describe('ApprovalsPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectList(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/plans');
  }

  async function open(role: Role, plans: PlanDto[]): Promise<TestRequest> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create('/approvals');
    root = harness.routeNativeElement!;
    await settle();
    const list = expectList();
    // Whole plans in the one list request: no request per plan.
    expect(list.request.params.get('detail')).toBe('full');
    list.flush({ items: plans, total: plans.length });
    await settle();
    return list;
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: plansTestProviders([
        { path: 'approvals', component: ApprovalsPage },
        { path: '**', component: StubPage },
      ]),
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    clearOverlays();
  });

  it('asks for the plans awaiting the plant manager and shows their numbers', async () => {
    const list = await open('plant_manager', [WAITING]);
    expect(list.request.params.get('awaitingMe')).toBe('true');
    const card = root.querySelector('li.approvals__card')!;
    expect(words(card.querySelector('h2'))).toBe('Second source for S-2-SHARED-A');
    const links = [...card.querySelectorAll('.approvals__links a')].map((link) =>
      link.getAttribute('href'));
    expect(links).toEqual(['/register/12', '/risk/5/suppliers/S-2-SHARED-A']);
    expect(words(card)).toContain('waiting for P-NORTH, P-SOUTH');
    const spof = [...card.querySelectorAll('tbody tr')].at(-1)!;
    expect([...spof.children].map(words)).toEqual(['Single point of failure', 'Yes', 'No longer']);
    expect(button(card, 'Approve for P-NORTH')).toBeDefined();
    expect(button(card, 'Approve for P-SOUTH')).toBeUndefined();
  });

  it('approves for a plant from the dialog, then reads the list again', async () => {
    await open('plant_manager', [WAITING]);
    button(root, 'Approve for P-NORTH')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    expect(words(dialog)).toContain('recorded for P-NORTH only');
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    const post = backend.expectOne('/api/plans/7/decisions');
    expect(post.request.body).toEqual({ plantCode: 'P-NORTH', decision: 'approved', comment: '' });
    post.flush(WAITING);
    await settle();
    await settle();
    expectList().flush({ items: [], total: 0 });
    await settle();
    expect(words(root)).toContain('Nothing waits for your decision.');
  });

  it('shows the dialog\'s refusal from the server and keeps it open', async () => {
    await open('plant_manager', [WAITING]);
    button(root, 'Approve for P-NORTH')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    backend.expectOne('/api/plans/7/decisions').flush(
      { error: { code: 'already_decided', message: 'P-NORTH has already decided this plan.' } },
      { status: 409, statusText: 'Conflict' });
    await settle();
    expect(words(dialog.querySelector('[role="alert"] span'))).toBe(
      'P-NORTH has already decided this plan.');
  });

  it('says so when nothing waits', async () => {
    await open('plant_manager', []);
    expect(words(root.querySelector('.approvals__empty'))).toContain(
      'Nothing waits for your decision.');
  });

  it('shows a risk manager the submitted plans, read-only', async () => {
    const readOnly = { ...WAITING, can: { ...WAITING.can, decideFor: [] } };
    const list = await open('risk_manager', [readOnly]);
    expect(list.request.params.get('status')).toBe('submitted');
    expect(list.request.params.has('awaitingMe')).toBe(false);
    expect(words(root)).toContain('this list is read-only');
    expect(button(root, 'Approve for')).toBeUndefined();
    expect(words(root)).toContain('waiting for P-NORTH, P-SOUTH');
  });
});
