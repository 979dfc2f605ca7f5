import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { MyTaskDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { MyTasksPage } from './my-tasks-page';
import { myTask } from './plan-fixtures';
import { StubPage, button, clearOverlays, plansTestProviders, words } from './plan-spec-helpers';

const TASKS: MyTaskDto[] = [
  myTask(41, { title: 'Sign the frame contract', dueDate: '2026-11-20', isOverdue: true }),
  myTask(42, { title: 'Audit the caster', dueDate: '2027-01-15' }),
  myTask(43, { title: 'Agree the safety stock', dueDate: null, isActive: false }),
];

describe('MyTasksPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectTasks(show: string): TestRequest {
    return backend.expectOne((request) =>
      request.url === '/api/tasks/mine' && request.params.get('show') === show);
  }

  function titles(): string[] {
    return [...root.querySelectorAll('tr.mat-mdc-row td:first-child')]
      .map((cell) => words(cell).split(' Plan ')[0]!);
  }

  async function open(tasks = TASKS): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole('buyer'));
    harness = await RouterTestingHarness.create('/tasks');
    root = harness.routeNativeElement!;
    await settle();
    expectTasks('open').flush({ items: tasks });
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: plansTestProviders([
        { path: 'tasks', component: MyTasksPage },
        { path: '**', component: StubPage },
      ]),
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    clearOverlays();
  });

  it('lists my open tasks overdue first, marked, with the plan and entry links', async () => {
    await open();
    expect(titles()).toEqual(['Sign the frame contract', 'Audit the caster',
      'Agree the safety stock']);
    const first = root.querySelector('tr.mat-mdc-row')!;
    expect(first.classList).toContain('tasks__row--overdue');
    expect(words(first)).toContain('overdue');
    const links = [...first.querySelectorAll('a')].map((link) => link.getAttribute('href'));
    expect(links).toEqual(['/plans/7', '/register/12']);
    const waiting = root.querySelectorAll('tr.mat-mdc-row')[2]!;
    expect(words(waiting)).toContain('starts on approval');
    expect(button(waiting, 'Mark done')).toBeUndefined();
  });

  it('sorts by a column header', async () => {
    await open();
    const header = [...root.querySelectorAll<HTMLElement>('th .mat-sort-header-container')]
      .find((cell) => words(cell).startsWith('Task'))!;
    header.click();
    await settle();
    expect(titles()).toEqual(['Agree the safety stock', 'Audit the caster',
      'Sign the frame contract']);
  });

  it('marks a task done and reads the list again', async () => {
    await open();
    button(root, 'Mark done')!.click();
    await settle();
    const patch = backend.expectOne('/api/tasks/41');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ status: 'done' });
    patch.flush({ ...TASKS[0], status: 'done' });
    await settle();
    expectTasks('open').flush({ items: TASKS.slice(1) });
    await settle();
    expect(titles()).toEqual(['Audit the caster', 'Agree the safety stock']);
  });

  it('shows all tasks on "All", and says when there are none', async () => {
    await open([]);
    expect(words(root.querySelector('.tasks__empty'))).toContain('No open tasks for you.');
    [...root.querySelectorAll<HTMLElement>('mat-button-toggle button')]
      .find((toggle) => words(toggle) === 'All')!
      .click();
    await settle();
    expectTasks('all').flush({ items: [myTask(44, { status: 'done' })] });
    await settle();
    expect(titles()).toEqual(['Qualify the second caster (44)']);
  });
});
