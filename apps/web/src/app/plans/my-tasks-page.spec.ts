import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { MyTaskDto, Role } from '@keelson/contracts';
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

  function expectTasks(show: string, url = '/api/tasks/mine'): TestRequest {
    return backend.expectOne((request) =>
      request.url === url && request.params.get('show') === show);
  }

  function toggle(label: string): HTMLElement {
    return [...root.querySelectorAll<HTMLElement>('mat-button-toggle button')]
      .find((candidate) => words(candidate) === label)!;
  }

  function headers(): string[] {
    return [...root.querySelectorAll('th')].map((cell) => words(cell));
  }

  function titles(): string[] {
    return [...root.querySelectorAll('tr.mat-mdc-row td:first-child')]
      .map((cell) => words(cell).split(' Plan ')[0]!);
  }

  async function open(tasks = TASKS, role: Role = 'buyer', url = '/tasks',
    expected: [string, string] = ['open', '/api/tasks/mine']): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create(url);
    root = harness.routeNativeElement!;
    await settle();
    expectTasks(...expected).flush({ items: tasks });
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

  it('filters the rows by the words typed, and says when none matches', async () => {
    await open();
    const box = root.querySelector<HTMLInputElement>('.tasks__search input')!;
    box.value = 'CASTER audit';
    box.dispatchEvent(new Event('input'));
    await settle();
    expect(titles()).toEqual(['Audit the caster']);
    box.value = 'S-2-SHARED-A frame';
    box.dispatchEvent(new Event('input'));
    await settle();
    expect(titles()).toEqual(['Sign the frame contract']);
    box.value = 'nothing like it';
    box.dispatchEvent(new Event('input'));
    await settle();
    expect(words(root.querySelector('.tasks__empty'))).toBe('No task matches "nothing like it".');
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
    toggle('All').click();
    await settle();
    expectTasks('all').flush({ items: [myTask(44, { status: 'done' })] });
    await settle();
    expect(titles()).toEqual(['Qualify the second caster (44)']);
  });

  it('lets a risk manager switch to everyone\'s tasks, with their owners, in the address',
    async () => {
      await open(TASKS, 'risk_manager');
      expect(words(root.querySelector('h1'))).toBe('My tasks');
      expect(headers()).not.toContain('Owner');
      toggle('Everyone\'s').click();
      await settle();
      expectTasks('open', '/api/tasks').flush({ items: [
        myTask(45, { title: 'Call the forge', owner: { id: 9, name: 'Ilse Varga' },
          isOverdue: true }),
        myTask(46, { title: 'Count the stock', owner: null })] });
      await settle();
      expect(TestBed.inject(Router).url).toBe('/tasks?whose=everyone');
      expect(words(root.querySelector('h1'))).toBe('Everyone\'s tasks');
      expect(headers().slice(0, 2)).toEqual(['Task', 'Owner']);
      const owners = [...root.querySelectorAll('tr.mat-mdc-row td:nth-child(2)')]
        .map((cell) => words(cell));
      expect(owners).toEqual(['Ilse Varga', 'Nobody yet']);
      toggle('Overdue').click();
      await settle();
      expectTasks('overdue', '/api/tasks').flush({ items: [] });
      await settle();
      expect(TestBed.inject(Router).url).toBe('/tasks?whose=everyone&show=overdue');
      // The export follows the list on screen.
      const exportLink = [...root.querySelectorAll('a')]
        .find((link) => words(link).includes('Export to xlsx'))!;
      expect(exportLink.getAttribute('href')).toBe('/api/tasks/export.xlsx?show=overdue');
      expect(words(root.querySelector('.tasks__empty'))).toContain('No task is overdue.');
    });

  it('opens on the filters of its address, as the home page links to it', async () => {
    await open([], 'admin', '/tasks?whose=everyone&show=overdue', ['overdue', '/api/tasks']);
    expect(words(root.querySelector('h1'))).toBe('Everyone\'s tasks');
  });

  it('keeps a buyer to their own tasks whatever the address says', async () => {
    await open([], 'buyer', '/tasks?whose=everyone&show=overdue', ['overdue', '/api/tasks/mine']);
    expect(words(root.querySelector('h1'))).toBe('My tasks');
    expect([...root.querySelectorAll('a')].find((link) => words(link).includes('Export'))!
      .getAttribute('href')).toBe('/api/tasks/mine/export.xlsx?show=overdue');
    expect(toggle('Everyone\'s')).toBeUndefined();
    expect(words(root.querySelector('.tasks__empty'))).toContain('None of your tasks is overdue.');
  });
});
