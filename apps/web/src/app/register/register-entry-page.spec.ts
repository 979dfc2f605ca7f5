import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { PlanSummaryDto, RegisterEntryDetailDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { planSummary } from '../plans/plan-fixtures';
import { userWithRole } from '../testing/user-fixtures';
import { registerEntryDetail } from './register-fixtures';
import { RegisterEntryPage } from './register-entry-page';

const ENTRY: RegisterEntryDetailDto = registerEntryDetail(12, {
  impactBand: 5,
  computedLikelihood: 3,
  likelihoodOverride: 4,
  notes: 'Second source under qualification.',
  overrides: [
    {
      id: 2,
      likelihood: 4,
      previous: null,
      reason: 'Plant fire at the foundry in October.',
      user: { id: 3, name: 'Rania Okafor' },
      createdAt: '2026-11-25T10:00:00.000Z',
    },
  ],
});

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('RegisterEntryPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectEntry(): TestRequest {
    return backend.expectOne('/api/register/12');
  }

  async function open(
    role: Role,
    entry = ENTRY,
    plans: PlanSummaryDto[] = [],
  ): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create('/register/12');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/network-versions/latest').flush({ id: 3 });
    if (role === 'admin') {
      backend
        .expectOne((request) => request.url === '/api/users')
        .flush({ items: [userWithRole('admin'), userWithRole('risk_manager')], total: 2 });
    }
    expectEntry().flush(entry);
    backend.expectOne('/api/register/12/plans').flush({ items: plans, total: plans.length });
    await settle();
    flushHistory();
    await settle();
  }

  // The history panel reads the entry's audit trail (its own spec tests what it shows).
  function flushHistory(): void {
    for (const request of backend.match('/api/audit/history/register_entry/12')) {
      request.flush({ items: [] });
    }
  }

  function button(label: string): HTMLButtonElement | undefined {
    return [...root.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
      words(candidate).includes(label),
    );
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [{ path: 'register/:id', component: RegisterEntryPage }],
          withComponentInputBinding(),
        ),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    flushHistory();
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('shows the entry, its score and the override history', async () => {
    await open('viewer');
    expect(words(root.querySelector('h1')!)).toBe('No. 12 Single source for cast housings (12)');
    const supplier = root.querySelector<HTMLAnchorElement>('dd a')!;
    expect(supplier.getAttribute('href')).toBe('/network/3/suppliers/S-2-SHARED-A');
    const score = [...root.querySelectorAll('.entry__score dd')].map(words);
    expect(score).toEqual(['5 of 5', '3 of 5', '4 of 5, used instead', '5 x 4 = ▲ 20 Critical']);
    const history = [...root.querySelectorAll('tr.mat-mdc-row td')].map(words);
    expect(history.slice(1)).toEqual([
      'Rania Okafor',
      'computed',
      '4',
      'Plant fire at the foundry in October.',
    ]);
    expect(words(root)).toContain('not a standard');
  });

  it.each(['viewer', 'buyer', 'plant_manager'] as const)(
    'is read-only for a %s: no form, no override',
    async (role) => {
      await open(role);
      expect(root.querySelector('form')).toBeNull();
      expect(root.querySelector('textarea')).toBeNull();
      expect(button('Override likelihood')).toBeUndefined();
      expect(words(root.querySelector('.entry__notes')!)).toBe(
        'Second source under qualification.',
      );
    },
  );

  it('says what a re-scoring flag means', async () => {
    await open('viewer', { ...ENTRY, flag: 'supplier_removed' });
    const note = root.querySelector('.entry__flag[role="note"] p')!;
    expect(words(note)).toBe('Supplier removed. The last quarterly re-scoring did not find this '
      + 'supplier in the network any more. Check whether it was replaced, then close the entry '
      + 'or keep it with a note.');
  });

  it('shows no flag note on an entry no re-scoring flagged', async () => {
    await open('viewer');
    expect(root.querySelector('.entry__flag')).toBeNull();
  });

  it('lists the entry\'s mitigation plans; risk managers may draft one', async () => {
    await open('risk_manager', ENTRY, [
      planSummary(7, { status: 'submitted', pendingPlants: ['P-SOUTH'] }),
      planSummary(4, { strategy: 'safety_stock', status: 'withdrawn' }),
    ]);
    const table = root.querySelector('table[aria-label="Mitigation plans"]')!;
    const rows = [...table.querySelectorAll('tbody tr')].map((row) =>
      [...row.querySelectorAll('td')].slice(0, 3).map(words));
    expect(rows).toEqual([
      ['Plan 7: Second source', 'Waiting for approval', 'P-SOUTH'],
      ['Plan 4: Safety stock', 'Withdrawn', '—'],
    ]);
    expect(table.querySelector('a')!.getAttribute('href')).toBe('/plans/7');
    const draft = [...root.querySelectorAll('a')]
      .find((link) => words(link) === 'add Draft a plan');
    expect(draft!.getAttribute('href')).toBe('/plans/new?entry=12');
  });

  it('offers no "Draft a plan" to a buyer, and says when there is no plan', async () => {
    await open('buyer');
    expect(words(root)).not.toContain('Draft a plan');
    expect(words(root)).toContain('No plan yet.');
  });

  it('saves only the changed fields with PATCH, then reads the entry again', async () => {
    await open('risk_manager');
    expect(root.querySelector('mat-select[formcontrolname="ownerId"]')).toBeNull();
    const notes = root.querySelector<HTMLTextAreaElement>('textarea[formcontrolname="notes"]')!;
    expect(notes.value).toBe('Second source under qualification.');
    notes.value = 'Second source qualified for 40 % of volume.';
    notes.dispatchEvent(new Event('input'));
    button('Save')!.click();
    await settle();
    const patch = backend.expectOne('/api/register/12');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(patch.request.body).toEqual({ notes: 'Second source qualified for 40 % of volume.' });
    patch.flush({ ...ENTRY, notes: patch.request.body.notes });
    await settle();
    const reload = expectEntry();
    expect(reload.request.method).toBe('GET');
    reload.flush({ ...ENTRY, notes: 'Second source qualified for 40 % of volume.' });
  });

  it('shows why the server refused a change', async () => {
    await open('admin');
    const title = root.querySelector<HTMLInputElement>('input[formcontrolname="title"]')!;
    title.value = 'Cast housings';
    title.dispatchEvent(new Event('input'));
    button('Save')!.click();
    await settle();
    backend
      .expectOne('/api/register/12')
      .flush(
        { error: { code: 'entry_closed', message: 'This entry is closed.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await settle();
    expect(words(root.querySelector('form [role="alert"]')!)).toContain('This entry is closed.');
  });

  it('overrides the likelihood from the dialog and reloads the score', async () => {
    await open('risk_manager', { ...ENTRY, likelihoodOverride: null, likelihood: 3 });
    button('Override likelihood')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    dialog.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((option) => words(option) === '2 · unlikely')!
      .click();
    await settle();
    const reason = dialog.querySelector<HTMLTextAreaElement>('textarea')!;
    reason.value = 'Dual-sourced since the November review.';
    reason.dispatchEvent(new Event('input'));
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    const post = backend.expectOne('/api/register/12/likelihood');
    expect(post.request.body).toEqual({
      likelihood: 2,
      reason: 'Dual-sourced since the November review.',
    });
    post.flush({});
    await settle();
    await settle();
    expectEntry().flush({ ...ENTRY, likelihoodOverride: 2, likelihood: 2, rating: 10 });
    await settle();
    expect(words(root.querySelectorAll('.entry__score dd')[2]!)).toBe('2 of 5, used instead');
  });
});
