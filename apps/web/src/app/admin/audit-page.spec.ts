import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { AuditEventDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { userWithRole } from '../testing/user-fixtures';
import { AuditPage, auditDiff } from './audit-page';

// Invented events shaped like the API's AuditEventDto; the people are the demo accounts.
const ROLE_CHANGE: AuditEventDto = {
  id: 31, action: 'user.role_changed', subjectType: 'user', subjectId: '4',
  user: { id: 1, name: 'Alma Reyes' },
  before: { role: 'viewer', plantCodes: [] },
  after: { role: 'plant_manager', plantCodes: ['P-NORTH'] },
  createdAt: '2026-12-01T10:00:00.000Z',
};
const RUN: AuditEventDto = {
  id: 30, action: 'run.succeeded', subjectType: 'analysis_run', subjectId: '5', user: null,
  before: null, after: { networkVersionId: 1, suppliers: 148 },
  createdAt: '2026-11-30T10:00:00.000Z',
};

describe('AuditPage', () => {
  let fixture: ComponentFixture<AuditPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  const expectList = () => backend.expectOne((request) => request.url === '/api/audit');
  const settle = () => fixture.whenStable();

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [AuditPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AuditPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne((request) => request.url === '/api/users').flush({
      items: [userWithRole('admin'), userWithRole('plant_manager')], total: 2 });
  });

  afterEach(() => backend.verify());

  const rows = () => [...root.querySelectorAll('tr.audit__row')];
  const cellsOf = (row: Element) =>
    [...row.querySelectorAll('td')].map((cell) => cell.textContent?.replace(/\s+/g, ' ').trim());
  const type = (name: string, value: string) => {
    const input = root.querySelector<HTMLInputElement>(`input[name="${name}"]`)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  const submit = async () => {
    root.querySelector<HTMLButtonElement>('button.audit__apply')!.click();
    await settle();
  };

  it('asks for the first page and lists who, action, subject and a sentence', async () => {
    const list = expectList();
    expect(list.request.params.get('limit')).toBe('50');
    expect(list.request.params.get('offset')).toBe('0');
    expect(list.request.params.keys().sort()).toEqual(['limit', 'offset']);
    list.flush({ items: [ROLE_CHANGE, RUN], total: 2 });
    await settle();
    const cells = rows().map(cellsOf);
    expect(cells[0]!.slice(1, 4)).toEqual(['Alma Reyes', 'user.role_changed', 'user 4']);
    expect(cells[0]![4]).toContain('Alma Reyes changed the role or plants of user #4');
    expect(cells[1]![1]).toBe('Keelson (system)');
    // A run has its own page; a user does not.
    expect(rows()[1]!.querySelector('a.audit__subject')?.getAttribute('href')).toBe('/runs/5');
    expect(rows()[0]!.querySelector('a.audit__subject')).toBeNull();
    expect(root.querySelector<HTMLAnchorElement>('a.audit__export')!.getAttribute('href'))
      .toBe('/api/audit/export.xlsx');
  });

  it('applies the filters to the list and to the export link, from the first page', async () => {
    expectList().flush({ items: [ROLE_CHANGE], total: 120 });
    await settle();
    type('action', 'plan.');
    type('q', 'P-NORTH');
    const form = fixture.componentInstance['form'];
    form.patchValue({ subjectType: 'plan', userId: 4, from: new Date(2026, 10, 1),
      to: new Date(2026, 10, 30) });
    await submit();
    const list = expectList();
    const params = list.request.params;
    expect(['action', 'subjectType', 'userId', 'from', 'to', 'q', 'offset']
      .map((key) => params.get(key)))
      .toEqual(['plan.', 'plan', '4', '2026-11-01', '2026-11-30', 'P-NORTH', '0']);
    list.flush({ items: [], total: 0 });
    await settle();
    expect(root.querySelector('.audit__empty')?.textContent?.trim())
      .toBe('No event matches these filters. Clear them to see the whole trail.');
    const href = root.querySelector<HTMLAnchorElement>('a.audit__export')!.getAttribute('href')!;
    expect(href).toBe('/api/audit/export.xlsx?action=plan.&subjectType=plan&from=2026-11-01' +
      '&to=2026-11-30&q=P-NORTH&userId=4');
  });

  it('suggests actions matching what is typed, prefixes first', async () => {
    expectList().flush({ items: [], total: 0 });
    await settle();
    const input = root.querySelector<HTMLInputElement>('input[name="action"]')!;
    input.focus();
    type('action', 'user.r');
    await settle();
    const options = [...document.querySelectorAll('mat-option')]
      .map((option) => option.textContent?.trim());
    expect(options).toEqual(['user.role_changed', 'user.reactivated']);
  });

  it('refuses a range that ends before it starts, without asking the server', async () => {
    expectList().flush({ items: [], total: 0 });
    await settle();
    fixture.componentInstance['form'].patchValue({ from: new Date(2026, 10, 30),
      to: new Date(2026, 10, 1) });
    await submit();
    backend.expectNone((request) => request.url === '/api/audit');
    expect(root.querySelector('.audit__range-error')?.textContent)
      .toBe('The "from" date is after the "to" date.');
  });

  it('pages on the server', async () => {
    expectList().flush({ items: [ROLE_CHANGE], total: 120 });
    await settle();
    root.querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-next')!.click();
    await settle();
    const next = expectList();
    expect(next.request.params.get('offset')).toBe('50');
    next.flush({ items: [RUN], total: 120 });
    await settle();
    expect(rows()).toHaveLength(1);
  });

  it('opens a row to show before and after side by side, changed fields marked', async () => {
    expectList().flush({ items: [ROLE_CHANGE, RUN], total: 2 });
    await settle();
    expect(root.querySelector('table.audit__diff')).toBeNull();
    (rows()[0] as HTMLElement).click();
    await settle();
    const lines = [...root.querySelectorAll('table.audit__diff tbody tr')];
    expect(lines.map((line) => [...line.children].map((cell) =>
      cell.textContent?.replace(/\s+/g, ' ').trim()))).toEqual([
      ['role changed', 'viewer', 'plant_manager'],
      ['plantCodes changed', '—', 'P-NORTH'],
    ]);
    expect(lines.every((line) => line.classList.contains('audit__diff--changed'))).toBe(true);
    (rows()[0] as HTMLElement).click();
    await settle();
    expect(root.querySelector('table.audit__diff')).toBeNull();
  });

  it("shows the API's message when the trail cannot be read", async () => {
    expectList().flush(
      { error: { code: 'forbidden', message: 'This needs the role Administrator.' } },
      { status: 403, statusText: 'Forbidden' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent)
      .toContain('This needs the role Administrator.');
    expect(root.querySelector('.audit__empty')?.textContent?.trim())
      .toBe('The audit trail could not be loaded.');
  });
});

describe('auditDiff', () => {
  it('keeps unchanged keys unmarked and shows a missing side as a dash', () => {
    expect(auditDiff({ ...RUN, before: { suppliers: 148, notes: 'a' },
      after: { suppliers: 148 } })).toEqual([
      { key: 'suppliers', before: '148', after: '148', isChanged: false },
      { key: 'notes', before: 'a', after: '—', isChanged: true },
    ]);
  });
});
