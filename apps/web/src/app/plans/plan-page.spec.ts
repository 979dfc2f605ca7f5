import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { PlanDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { planDetail, planTask, whatIfResult } from './plan-fixtures';
import { PlanPage } from './plan-page';
import {
  StubPage,
  button,
  clearOverlays,
  plansTestProviders,
  type,
  words,
} from './plan-spec-helpers';

const DRAFT: PlanDto = planDetail(7, {
  can: { edit: true, submit: true, withdraw: true, decideFor: [] },
});

describe('PlanPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  async function open(role: Role, plan: PlanDto): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create('/plans/7');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plans/7').flush(plan);
    await settle();
    flushHistory();
    await settle();
  }

  // The history panel reads the plan's audit trail (its own spec tests what it shows).
  function flushHistory(): void {
    for (const request of backend.match('/api/audit/history/plan/7')) {
      request.flush({ items: [] });
    }
  }

  async function confirmDialog(label: string): Promise<void> {
    await settle();
    button(document.querySelector('mat-dialog-container')!, label)!.click();
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: plansTestProviders([
        { path: 'plans/:id', component: PlanPage },
        { path: '**', component: StubPage },
      ]),
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    flushHistory();
    backend.verify();
    clearOverlays();
  });

  it('shows the plan, its entry, the supplier risk page and the draft\'s buttons', async () => {
    await open('risk_manager', DRAFT);
    expect(words(root.querySelector('h1'))).toBe('Plan 7 Second source');
    expect(words(root.querySelector('kl-plan-status-chip'))).toBe('Draft');
    const links = [...root.querySelectorAll<HTMLAnchorElement>('.plan__facts a')]
      .map((link) => link.getAttribute('href'));
    expect(links).toEqual(['/register/12', '/risk/5/suppliers/S-2-SHARED-A']);
    expect(words(root)).toContain(
      'S-2-ALT becomes a qualified source of I-CAST-1 for every buyer it supplies today');
    expect(words(root)).toContain('No what-if yet.');
    for (const label of ['Edit', 'Run what-if', 'Submit for approval', 'Withdraw']) {
      expect(button(root, label), label).toBeDefined();
    }
    expect(words(root)).toContain('Tasks start once every plant manager has approved');
  });

  it('runs the what-if and shows before and after with what the numbers mean', async () => {
    await open('risk_manager', DRAFT);
    button(root, 'Run what-if')!.click();
    await settle();
    const post = backend.expectOne('/api/plans/7/what-if');
    expect(post.request.method).toBe('POST');
    post.flush(whatIfResult());
    await settle();
    backend.expectOne('/api/plans/7').flush({ ...DRAFT, whatIf: whatIfResult() });
    await settle();
    // The history panel reads the plan's trail again after the action.
    expect(backend.match('/api/audit/history/plan/7').length).toBe(1);
    const table = root.querySelector('table[aria-label="What-if: before and after the plan"]')!;
    const rows = [...table.querySelectorAll('tbody tr')].map((row) =>
      [...row.children].map((cell) => words(cell)));
    expect(rows).toEqual([
      ['Products lost', '2 P-100, P-200', '0'],
      ['Revenue impact', '1,440,000', '0'],
      ["Supplier's time to recover", '12 weeks', '0 weeks'],
      ['Rating', '5 x 4 = ▲ 20 Critical', '1 x 4 = ○ 4 Low'],
      ['Single point of failure', 'Yes', 'No longer'],
    ]);
    const note = words(root.querySelector('.what-if__note'));
    expect(note).toContain('the numbers the plan is approved on');
    expect(note).toContain('network version 3');
    expect(note).toContain('support a decision');
  });

  it('names the change a what-if refused, by its number', async () => {
    await open('risk_manager', DRAFT);
    button(root, 'Run what-if')!.click();
    await settle();
    const path = 'body.changes[0].itemCode';
    const message = 'the network has no item I-CAST-1';
    backend.expectOne('/api/plans/7/what-if').flush(
      { error: { code: 'invalid_request', message: `${path}: ${message}`,
        details: { issues: [{ path, message }] } } },
      { status: 400, statusText: 'Bad Request' });
    await settle();
    expect(words(root.querySelector('[role="alert"] span'))).toBe(
      'Change 1: the network has no item I-CAST-1. Edit the plan to correct it.');
  });

  it('submits after a confirmation and reads the plan again', async () => {
    await open('risk_manager', DRAFT);
    button(root, 'Submit for approval')!.click();
    await confirmDialog('Submit');
    backend.expectOne('/api/plans/7/submit').flush(planDetail(7, { status: 'submitted' }));
    await settle();
    backend.expectOne('/api/plans/7').flush(planDetail(7, {
      status: 'submitted',
      pendingPlants: ['P-NORTH', 'P-SOUTH'],
    }));
    await settle();
    expect(words(root.querySelector('kl-plan-status-chip'))).toBe('Waiting for approval');
    expect(words(root)).toContain('Waiting for: P-NORTH, P-SOUTH.');
    expect(button(root, 'Submit for approval')).toBeUndefined();
  });

  it('shows the server\'s refusal in a banner', async () => {
    await open('risk_manager', DRAFT);
    button(root, 'Withdraw')!.click();
    await confirmDialog('Withdraw');
    backend.expectOne('/api/plans/7/withdraw').flush(
      { error: { code: 'forbidden', message: 'Only the plan\'s author may withdraw it.' } },
      { status: 403, statusText: 'Forbidden' });
    await settle();
    expect(words(root.querySelector('[role="alert"]'))).toContain(
      'Only the plan\'s author may withdraw it.');
  });

  it('shows the rejection comment on a returned draft, and each plant\'s decision', async () => {
    await open('risk_manager', planDetail(7, {
      rejectionComment: 'Name the caster and its audit date.',
      decisions: [
        {
          id: 2, plantCode: 'P-SOUTH', decision: 'rejected',
          comment: 'Name the caster and its audit date.',
          user: { id: 5, name: 'Sergio Marin' },
          submittedAt: '2026-12-01T10:00:00.000Z', createdAt: '2026-12-01T12:00:00.000Z',
        },
        {
          id: 1, plantCode: 'P-NORTH', decision: 'approved', comment: '',
          user: { id: 4, name: 'Pia Lindqvist' },
          submittedAt: '2026-12-01T10:00:00.000Z', createdAt: '2026-12-01T11:00:00.000Z',
        },
      ],
    }));
    expect(words(root.querySelector('[aria-label="Why the plan was returned"]'))).toContain(
      'Name the caster and its audit date.');
    const rows = [...root.querySelectorAll('table[aria-label="Decisions"] tbody tr')]
      .map((row) => [...row.querySelectorAll('td')].map(words));
    expect(rows.map((row) => [row[0], row[1], row[2], row[4]])).toEqual([
      ['P-SOUTH', 'Rejected', 'Sergio Marin', 'Name the caster and its audit date.'],
      ['P-NORTH', 'Approved', 'Pia Lindqvist', '—'],
    ]);
  });

  it('lets a plant manager reject for their plant only with a comment', async () => {
    await open('plant_manager', planDetail(7, {
      status: 'submitted',
      whatIf: whatIfResult(),
      can: { edit: false, submit: false, withdraw: false, decideFor: ['P-NORTH'] },
    }));
    expect(button(root, 'Approve for P-NORTH')).toBeDefined();
    expect(button(root, 'Approve for P-SOUTH')).toBeUndefined();
    expect(button(root, 'Run what-if')).toBeUndefined();
    button(root, 'Reject for P-NORTH')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    expect(words(dialog.querySelector('mat-error'))).toBe('Say why you reject the plan.');
    type(dialog.querySelector('textarea')!, 'Too slow');
    type(dialog.querySelector('textarea')!, 'No');
    await settle();
    expect(words(dialog.querySelector('mat-error'))).toBe('Say why in at least 5 characters.');
    type(dialog.querySelector('textarea')!, 'The caster has no audit yet.');
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    const post = backend.expectOne('/api/plans/7/decisions');
    expect(post.request.body).toEqual({
      plantCode: 'P-NORTH',
      decision: 'rejected',
      comment: 'The caster has no audit yet.',
    });
    post.flush(planDetail(7, { status: 'draft' }));
    await settle();
    await settle();
    backend.expectOne('/api/plans/7').flush(planDetail(7));
  });

  it('lets the owner change an active task\'s status; others only read it', async () => {
    const tasks = [
      planTask(31, { isActive: true, owner: { id: 2, name: 'Bruno Keller' } }),
      planTask(32, { isActive: true, owner: { id: 3, name: 'Rania Okafor' }, isOverdue: true }),
    ];
    await open('buyer', planDetail(7, { status: 'approved', tasks }));
    const rows = root.querySelectorAll('table[aria-label="Tasks of the plan"] tbody tr');
    expect(rows[0]!.querySelector('kl-task-status-menu')).not.toBeNull();
    expect(rows[1]!.querySelector('kl-task-status-menu')).toBeNull();
    expect(words(rows[1])).toContain('overdue');
    rows[0]!.querySelector<HTMLButtonElement>('kl-task-status-menu button')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('[mat-menu-item]')]
      .find((item) => words(item) === 'Doing')!
      .click();
    await settle();
    const patch = backend.expectOne('/api/tasks/31');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ status: 'doing' });
    patch.flush({ ...tasks[0], status: 'doing' });
    await settle();
    backend.expectOne('/api/plans/7').flush(planDetail(7, { status: 'in_progress', tasks }));
  });

  it('opens a task\'s comments and adds one, then reads the plan again', async () => {
    await open('plant_manager', planDetail(7, { status: 'submitted',
      tasks: [planTask(31, { commentCount: 1 })] }));
    const toggle = root.querySelector<HTMLButtonElement>(
      'button[aria-label^="Comments on Qualify the second caster (31)"]')!;
    toggle.click();
    await settle();
    backend.expectOne('/api/tasks/31').flush({
      ...planTask(31, { commentCount: 1 }),
      plan: planDetail(7),
      comments: [{ id: 1, text: 'Quote requested.', user: { id: 3, name: 'Rania Okafor' },
        createdAt: '2026-12-01T12:00:00.000Z' }],
    });
    await settle();
    const panel = root.querySelector('kl-task-comments')!;
    expect(words(panel.querySelector('li'))).toContain('Rania Okafor');
    expect(words(panel.querySelector('li p'))).toBe('Quote requested.');
    button(panel, 'Comment')!.click();
    await settle();
    expect(words(panel.querySelector('mat-error'))).toBe('Write a comment first.');
    type(panel.querySelector('textarea')!, 'The caster confirmed the audit for January.');
    button(panel, 'Comment')!.click();
    await settle();
    const post = backend.expectOne('/api/tasks/31/comments');
    expect(post.request.body).toEqual({ text: 'The caster confirmed the audit for January.' });
    post.flush({ id: 2, text: post.request.body.text, user: { id: 4, name: 'Pia Lindqvist' },
      createdAt: '2026-12-01T13:00:00.000Z' });
    await settle();
    expect(panel.querySelectorAll('li').length).toBe(2);
    backend.expectOne('/api/plans/7').flush(planDetail(7, { status: 'submitted',
      tasks: [planTask(31, { commentCount: 2 })] }));
    await settle();
    expect(root.querySelector('kl-task-comments')).not.toBeNull();
  });

  it('says what comes next once every task is done', async () => {
    await open('risk_manager', planDetail(7, { status: 'done' }));
    const note = root.querySelector('.plan__done')!;
    expect(words(note)).toContain('can now be closed, or re-scored');
    expect(note.querySelector('a')!.getAttribute('href')).toBe('/register/12');
  });
});
