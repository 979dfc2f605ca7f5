import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { PlantDto, Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { registerEntry } from './register-fixtures';
import { RegisterPage } from './register-page';
import { REGISTER_SEARCH_DEBOUNCE_MS } from './register-table-state';

/** The demo workspace's plants (names as the API seeds them). */
const PLANTS: PlantDto[] = [
  { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
  { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
];

const ROWS = [
  registerEntry(12, { impactBand: 5, computedLikelihood: 3, likelihoodOverride: 4 }),
  registerEntry(7, {
    title: 'Late deliveries of gaskets',
    supplierCode: 'S-0042',
    supplierName: null,
    plants: ['P-NORTH', 'P-SOUTH'],
    owner: null,
    status: 'mitigating',
    impactBand: 2,
    computedLikelihood: 2,
  }),
];

@Component({ template: 'entry' })
class EntryStub {}

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('RegisterPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectList(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/register');
  }

  async function open(url: string, role: Role = 'risk_manager'): Promise<TestRequest> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create(url);
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    return expectList();
  }

  function button(label: string): HTMLElement | undefined {
    return [...root.querySelectorAll<HTMLElement>('button, a')].find((candidate) =>
      words(candidate).includes(label),
    );
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'register', component: RegisterPage },
          { path: 'register/:id', component: EntryStub },
        ]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('asks for the worst ratings first, 25 a page, when the URL says nothing', async () => {
    const list = await open('/register');
    expect(params(list)).toEqual({ sort: 'rating', order: 'desc', limit: '25', offset: '0' });
    list.flush({ items: ROWS, total: 2 });
    await settle();
    const cells = [...root.querySelectorAll('tr.mat-mdc-row')].map((row) =>
      [...row.querySelectorAll('td')].map(words),
    );
    expect(cells[0]!.slice(0, 9)).toEqual([
      '12',
      'Single source for cast housings (12)',
      'S-2-SHARED-A Brenna Foundry',
      'P-NORTH',
      'Rania Okafor',
      'Open',
      '4 overridden',
      '5',
      '▲ 20 Critical',
    ]);
    expect(cells[1]!.slice(2, 9)).toEqual([
      'S-0042',
      'P-NORTH, P-SOUTH',
      'Nobody yet',
      'Mitigating',
      '2',
      '2',
      '○ 4 Low',
    ]);
    expect(root.querySelector('kl-rating-chip')?.getAttribute('aria-label')).toBe(
      'Rating 20, critical band',
    );
    expect(words(root)).toContain('common practice in risk registers, not a standard');
    expect(words(root)).toContain("your company's own procedures make it");
  });

  it('sends the filters, sort and page of the URL to the server', async () => {
    const list = await open(
      '/register?status=open&ratingBand=high&plant=P-NORTH&q=cast&sort=updatedAt&order=asc' +
        '&limit=50&offset=50',
    );
    expect(params(list)).toEqual({
      q: 'cast',
      status: 'open',
      ratingBand: 'high',
      plant: 'P-NORTH',
      sort: 'updatedAt',
      order: 'asc',
      limit: '50',
      offset: '50',
    });
    list.flush({ items: ROWS, total: 120 });
    await settle();
    const exportLink = root.querySelector<HTMLAnchorElement>('a[download]')!;
    expect(exportLink.getAttribute('href')).toBe(
      '/api/register/export.xlsx?q=cast&status=open&ratingBand=high&plant=P-NORTH' +
        '&sort=updatedAt&order=asc',
    );
    const print = button('Print') as HTMLAnchorElement;
    const printUrl = new URL(print.getAttribute('href')!, 'http://keelson.test');
    expect(printUrl.pathname).toBe('/register/print');
    expect(Object.fromEntries(printUrl.searchParams)).toEqual({
      q: 'cast',
      status: 'open',
      ratingBand: 'high',
      plant: 'P-NORTH',
      sort: 'updatedAt',
      order: 'asc',
    });
  });

  it('ignores a status, band or flag the server does not know', async () => {
    const list = await open('/register?status=lost&ratingBand=extreme&flag=stale');
    expect(params(list)['status']).toBeUndefined();
    expect(params(list)['ratingBand']).toBeUndefined();
    expect(params(list)['flag']).toBeUndefined();
    list.flush({ items: [], total: 0 });
  });

  it('sends the re-scoring flag filter of the URL to the server', async () => {
    const list = await open('/register?flag=flagged');
    expect(params(list)['flag']).toBe('flagged');
    list.flush({ items: [], total: 0 });
  });

  it('sorts on the server when a header is clicked and keeps it in the URL', async () => {
    (await open('/register')).flush({ items: ROWS, total: 2 });
    await settle();
    const header = [...root.querySelectorAll<HTMLElement>('th .mat-sort-header-container')].find(
      (candidate) => words(candidate) === 'Likelihood',
    )!;
    header.click();
    await settle();
    const sorted = expectList();
    expect(params(sorted)).toMatchObject({ sort: 'likelihood', order: 'asc', offset: '0' });
    sorted.flush({ items: ROWS, total: 2 });
    expect(TestBed.inject(Router).url).toBe('/register?sort=likelihood&order=asc');
  });

  it('searches once typing pauses, from the first page', async () => {
    (await open('/register?offset=25')).flush({ items: ROWS, total: 60 });
    await settle();
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 'gasket';
    input.dispatchEvent(new Event('input'));
    await new Promise((resolve) => setTimeout(resolve, REGISTER_SEARCH_DEBOUNCE_MS + 50));
    await settle();
    const search = expectList();
    expect(params(search)).toMatchObject({ q: 'gasket', offset: '0' });
    search.flush({ items: [ROWS[1]], total: 1 });
    await settle();
    expect(root.querySelectorAll('tr.mat-mdc-row')).toHaveLength(1);
  });

  it.each(['viewer', 'buyer', 'plant_manager'] as const)(
    'offers no "New entry" to a %s',
    async (role) => {
      (await open('/register', role)).flush({ items: ROWS, total: 2 });
      await settle();
      expect(button('New entry')).toBeUndefined();
      expect(button('Export to xlsx')).toBeDefined();
    },
  );

  it('creates an entry from the dialog, owned by the risk manager, then opens it', async () => {
    (await open('/register')).flush({ items: ROWS, total: 2 });
    await settle();
    button('New entry')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    expect(words(dialog)).toContain('Owner: Rania Okafor');
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    expect([...dialog.querySelectorAll('mat-error')].map(words)).toEqual([
      "Enter the supplier's code.",
      'Say in a few words what the risk is.',
    ]);
    backend.expectNone((request) => request.method === 'POST');

    const fill = (name: string, value: string): void => {
      const field = dialog.querySelector<HTMLInputElement | HTMLTextAreaElement>(
        `[formcontrolname="${name}"]`,
      )!;
      field.value = value;
      field.dispatchEvent(new Event('input'));
    };
    fill('supplierCode', ' S-2-SHARED-B ');
    fill('title', 'Only source of the sealing rings');
    fill('notes', 'Raised in the November review.');
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
    const post = backend.expectOne('/api/register');
    expect(post.request.method).toBe('POST');
    expect(post.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(post.request.body).toEqual({
      supplierCode: 'S-2-SHARED-B',
      title: 'Only source of the sealing rings',
      ownerId: 3,
      notes: 'Raised in the November review.',
    });
    post.flush(registerEntry(31, { origin: 'manual' }));
    await settle();
    await settle();
    expect(TestBed.inject(Router).url).toBe('/register/31');
  });

  it('lets an admin choose the owner from the users list', async () => {
    (await open('/register', 'admin')).flush({ items: ROWS, total: 2 });
    await settle();
    button('New entry')!.click();
    await settle();
    const users = backend.expectOne((request) => request.url === '/api/users');
    expect(params(users)).toEqual({ limit: '200' });
    users.flush({
      items: [userWithRole('admin'), userWithRole('risk_manager')],
      total: 2,
    });
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    const owner = 'mat-select[formcontrolname="ownerId"] .mat-mdc-select-trigger';
    dialog.querySelector<HTMLElement>(owner)!.click();
    await settle();
    expect([...document.querySelectorAll('mat-option')].map(words)).toEqual([
      'Nobody yet',
      'Alma Reyes',
      'Rania Okafor',
    ]);
  });

  it('marks an entry flagged by the re-scoring, and says what the flag means', async () => {
    const flagged = [
      registerEntry(21, { flag: 'supplier_removed' }),
      registerEntry(22, { flag: 'no_longer_matters' }),
      ...ROWS,
    ];
    (await open('/register')).flush({ items: flagged, total: 4 });
    await settle();
    const chips = [...root.querySelectorAll<HTMLElement>('.register__flag')];
    expect(chips.map(words)).toEqual(['flag Supplier removed', 'flag No longer matters']);
    expect(chips[0]!.getAttribute('aria-label')).toContain(
      'did not find this supplier in the network any more',
    );
    expect(chips[1]!.getAttribute('aria-label')).toContain('nothing is closed automatically');
    chips[0]!.dispatchEvent(new Event('focus'));
    await settle();
    await new Promise((resolve) => setTimeout(resolve, 50));
    await settle();
    expect(words(document.querySelector('.cdk-overlay-container') ?? document.body)).toContain(
      'Check whether it was replaced',
    );
  });
});
