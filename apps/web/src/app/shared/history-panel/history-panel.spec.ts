import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { AuditEventDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../../auth/api-interceptor';
import { changedFields, describeAuditEvent, relativeTime } from './audit-sentence';
import { HistoryPanel } from './history-panel';

// Invented events shaped like the API's AuditEventDto; the people are the demo accounts.
const APPROVED: AuditEventDto = {
  id: 12, action: 'plan.approved', subjectType: 'plan', subjectId: '3',
  user: { id: 4, name: 'Pia Lindqvist' },
  before: { status: 'submitted' },
  after: { plantCode: 'P-NORTH', decision: 'approved', comment: 'ok', planStatus: 'approved',
    entryId: 7 },
  createdAt: '2026-12-01T10:00:00.000Z',
};
const EDITED: AuditEventDto = {
  id: 9, action: 'register.updated', subjectType: 'register_entry', subjectId: '7',
  user: { id: 3, name: 'Rania Okafor' },
  before: { status: 'open', notes: '' }, after: { status: 'mitigating', notes: '' },
  createdAt: '2026-11-30T10:00:00.000Z',
};

describe('HistoryPanel', () => {
  let fixture: ComponentFixture<HistoryPanel>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [HistoryPanel],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(HistoryPanel);
    fixture.componentRef.setInput('subjectType', 'register_entry');
    fixture.componentRef.setInput('subjectId', 7);
    root = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  });

  afterEach(() => backend.verify());

  const flushHistory = async (
    items: AuditEventDto[],
    url = '/api/audit/history/register_entry/7',
  ) => {
    backend.expectOne(url).flush({ items });
    await fixture.whenStable();
  };

  it('shows one line per event with who, a sentence and the changed fields', async () => {
    await flushHistory([APPROVED, EDITED]);
    const items = [...root.querySelectorAll('li.history__item')];
    expect(items).toHaveLength(2);
    expect(items[0]!.querySelector('.history__who')?.textContent).toBe('Pia Lindqvist');
    expect(items[0]!.querySelector('.history__sentence')?.textContent)
      .toBe("Pia Lindqvist approved plan #3 for P-NORTH: 'ok'");
    // A decision's plant and comment are details; the plan's status is what changed.
    expect(items[0]!.querySelector('.history__change')?.textContent?.replace(/\s+/g, ' ').trim())
      .toBe('status: submitted → approved');
    // Only what differs is listed; the entry id is context, not a change.
    const changes = [...items[1]!.querySelectorAll('.history__change')]
      .map((change) => change.textContent?.replace(/\s+/g, ' ').trim());
    expect(changes).toEqual(['status: open → mitigating']);
    const when = items[0]!.querySelector('time')!;
    expect(when.getAttribute('datetime')).toBe(APPROVED.createdAt);
    expect(when.getAttribute('title')).toMatch(/2026/);
  });

  it('says so when nothing has been recorded', async () => {
    await flushHistory([]);
    expect(root.querySelector('.history__empty')?.textContent?.trim())
      .toBe('No changes recorded yet');
  });

  it("shows the API's message when the history may not be read", async () => {
    backend.expectOne('/api/audit/history/register_entry/7').flush(
      { error: { code: 'not_found', message: 'There is no register entry 7.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await fixture.whenStable();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'There is no register entry 7.');
    expect(root.querySelector('.history__empty')).toBeNull();
  });

  it('fetches again on refresh(), on a new reloadKey and for another subject', async () => {
    await flushHistory([]);
    fixture.componentInstance.refresh();
    await fixture.whenStable();
    await flushHistory([EDITED]);
    expect(root.querySelectorAll('li.history__item')).toHaveLength(1);

    fixture.componentRef.setInput('reloadKey', 1);
    await fixture.whenStable();
    await flushHistory([APPROVED, EDITED]);
    expect(root.querySelectorAll('li.history__item')).toHaveLength(2);

    fixture.componentRef.setInput('subjectType', 'plan');
    fixture.componentRef.setInput('subjectId', '3');
    await fixture.whenStable();
    await flushHistory([APPROVED], '/api/audit/history/plan/3');
    expect(root.querySelectorAll('li.history__item')).toHaveLength(1);
  });
});

describe('audit sentences', () => {
  it('names the system when no user acted, and words unknown actions', () => {
    expect(describeAuditEvent({ ...EDITED, user: null, action: 'run.succeeded',
      subjectType: 'analysis_run', subjectId: '5' }))
      .toBe('Analysis run 5 finished (started by Keelson)');
    expect(describeAuditEvent({ ...EDITED, action: 'thing.did_stuff' }))
      .toBe('Rania Okafor: thing did stuff (register_entry 7)');
  });

  it('words the re-scoring and its flags', () => {
    expect(describeAuditEvent({ ...EDITED, user: null, action: 'register.flag_changed',
      before: { flag: null }, after: { flag: 'supplier_removed', rescoringId: 2 } }))
      .toBe("Keelson's re-scoring flagged entry #7: its supplier is no longer in the network");
    expect(describeAuditEvent({ ...EDITED, action: 'rescoring.started',
      subjectType: 'rescoring_run', subjectId: '2', before: null,
      after: { quarterLabel: '2027-Q1' } }))
      .toBe('Rania Okafor started re-scoring 2027-Q1 (#2)');
  });

  it('words a comment, and a field that changed its value', () => {
    expect(describeAuditEvent({ ...EDITED, action: 'task.commented', subjectType: 'plan_task',
      subjectId: '8', before: null, after: { text: 'Booked the audit', planId: 3 } }))
      .toBe("Rania Okafor commented on task #8: 'Booked the audit'");
  });

  it('lists changed fields with lists joined and nothing as a dash', () => {
    expect(changedFields({ role: 'viewer', plantCodes: [] },
      { role: 'plant_manager', plantCodes: ['P-NORTH', 'P-EAST'] })).toEqual([
      { key: 'role', label: 'role', before: 'viewer', after: 'plant_manager' },
      { key: 'plantCodes', label: 'plant codes', before: '—', after: 'P-NORTH, P-EAST' },
    ]);
    expect(changedFields(null, { title: 'Call supplier' })).toEqual([]);
    // A deleted task: its last state, and nothing after.
    expect(changedFields({ title: 'Call supplier', status: 'todo' }, { planId: 3, entryId: 7 }))
      .toEqual([]);
  });

  it('words times relative to now', () => {
    const now = new Date('2026-12-02T12:00:00.000Z');
    expect(relativeTime('2026-12-02T09:00:00.000Z', now)).toBe('3 hours ago');
    expect(relativeTime('2026-12-01T12:00:00.000Z', now)).toBe('yesterday');
    expect(relativeTime('2026-12-02T11:59:40.000Z', now)).toBe('just now');
  });
});
