import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { COUNTRIES, PLANTS, supplierRow } from './network-fixtures';
import { SuppliersTable } from './suppliers-table';
import { SEARCH_DEBOUNCE_MS } from './url-table-state';

const ROWS = [
  supplierRow('S-0001', { name: 'Orvik Castings' }),
  supplierRow('S-0002', { name: 'Halden Gears', tier: 2, country: 'VN', region: 'Asia' }),
];

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

describe('SuppliersTable', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectSuppliers(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/network-versions/7/suppliers');
  }

  async function open(url: string): Promise<TestRequest> {
    harness = await RouterTestingHarness.create(url);
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    backend.expectOne('/api/countries').flush(COUNTRIES);
    return expectSuppliers();
  }

  async function choose(label: string, option: string): Promise<void> {
    const field = [...root.querySelectorAll('mat-form-field')].find((candidate) =>
      candidate.querySelector('mat-label')?.textContent?.includes(label),
    )!;
    field.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((candidate) => candidate.textContent?.trim() === option)!
      .click();
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [
            {
              path: 'network/:versionId',
              children: [{ path: 'suppliers', component: SuppliersTable }],
            },
          ],
          withComponentInputBinding(),
        ),
        provideHttpClient(),
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

  it('asks for the first page sorted by code and renders one linked row per supplier', async () => {
    const first = await open('/network/7/suppliers');
    expect(params(first)).toEqual({ sort: 'code', order: 'asc', limit: '25', offset: '0' });
    first.flush({ items: ROWS, total: 12_480 });
    await settle();

    const rows = [...root.querySelectorAll('tr.mat-mdc-row')];
    expect(rows).toHaveLength(2);
    expect([...rows[1]!.querySelectorAll('td')].map((cell) => cell.textContent?.trim())).toEqual(
      ['S-0002', 'Halden Gears', 'VN', 'Asia', '2', '8', '62', '91', 'Yes', '1', '0',
        'P-NORTH'],
    );
    expect(rows[0]!.querySelector('a')?.getAttribute('href')).toBe('/network/7/suppliers/S-0001');
    expect(root.querySelector('.mat-mdc-paginator-range-label')?.textContent).toContain('12480');
  });

  it('reads filters, sort and page from the URL, so links and back/forward work', async () => {
    const request = await open(
      '/network/7/suppliers?q=orv&tier=2&country=VN&region=Asia&plant=P-NORTH' +
        '&sort=recoveryWeeks&order=desc&limit=50&offset=100',
    );
    expect(params(request)).toEqual({
      q: 'orv',
      tier: '2',
      country: 'VN',
      region: 'Asia',
      plant: 'P-NORTH',
      sort: 'recoveryWeeks',
      order: 'desc',
      limit: '50',
      offset: '100',
    });
    request.flush({ items: ROWS, total: 400 });
    await settle();
    expect(root.querySelector<HTMLInputElement>('input[type="search"]')!.value).toBe('orv');
    expect(root.querySelector('.mat-mdc-paginator-range-label')?.textContent).toContain('101');

    await harness.navigateByUrl('/network/7/suppliers?tier=3');
    await settle();
    const back = expectSuppliers();
    expect(params(back)).toEqual({
      tier: '3',
      sort: 'code',
      order: 'asc',
      limit: '25',
      offset: '0',
    });
    back.flush({ items: [], total: 0 });
    await settle();
    expect(root.querySelector<HTMLInputElement>('input[type="search"]')!.value).toBe('');
    expect(root.textContent).toContain('No supplier matches these filters.');
  });

  it('searches once typing pauses, from the first page, and puts the text in the URL', async () => {
    (await open('/network/7/suppliers?offset=50')).flush({ items: ROWS, total: 400 });
    await settle();
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    for (const text of ['h', 'ha', 'hal']) {
      input.value = text;
      input.dispatchEvent(new Event('input'));
    }
    backend.expectNone((request) => request.url.endsWith('/suppliers'));
    await new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
    await settle();
    const search = expectSuppliers();
    expect(params(search)).toMatchObject({ q: 'hal', offset: '0' });
    search.flush({ items: [ROWS[1]], total: 1 });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/network/7/suppliers?q=hal');
    expect(root.querySelectorAll('tr.mat-mdc-row')).toHaveLength(1);
  });

  it('filters by tier, country, region and plant through the selects', async () => {
    (await open('/network/7/suppliers')).flush({ items: ROWS, total: 2 });
    await settle();
    const steps: [string, string, Record<string, string>][] = [
      ['Tier', 'Tier 2', { tier: '2' }],
      ['Country', 'VN · Viet Nam', { tier: '2', country: 'VN' }],
      ['Region', 'Asia', { tier: '2', country: 'VN', region: 'Asia' }],
      ['Plant served', 'P-SOUTH · Castellar Works', { tier: '2', country: 'VN', region: 'Asia',
        plant: 'P-SOUTH' }],
    ];
    for (const [label, option, expected] of steps) {
      await choose(label, option);
      const request = expectSuppliers();
      expect(params(request)).toEqual({ ...expected, sort: 'code', order: 'asc', limit: '25',
        offset: '0' });
      request.flush({ items: [ROWS[1]], total: 1 });
      await settle();
    }
    expect(TestBed.inject(Router).url).toBe(
      '/network/7/suppliers?tier=2&country=VN&region=Asia&plant=P-SOUTH',
    );
  });

  it('sorts on the server when a header is clicked, and pages with the paginator', async () => {
    (await open('/network/7/suppliers')).flush({ items: ROWS, total: 60 });
    await settle();
    const header = (label: string): HTMLElement =>
      [...root.querySelectorAll<HTMLElement>('th')].find((cell) =>
        cell.textContent?.includes(label),
      )!;

    header('Name').click();
    await settle();
    const byName = expectSuppliers();
    expect(params(byName)).toMatchObject({ sort: 'name', order: 'asc', offset: '0' });
    byName.flush({ items: ROWS, total: 60 });
    await settle();

    header('Name').click();
    await settle();
    const byNameDown = expectSuppliers();
    expect(params(byNameDown)).toMatchObject({ sort: 'name', order: 'desc' });
    byNameDown.flush({ items: ROWS, total: 60 });
    await settle();

    root.querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-next')!.click();
    await settle();
    const next = expectSuppliers();
    expect(params(next)).toEqual({ sort: 'name', order: 'desc', limit: '25', offset: '25' });
    next.flush({ items: ROWS, total: 60 });
    await settle();
    expect(TestBed.inject(Router).url).toBe('/network/7/suppliers?sort=name&order=desc&offset=25');
  });

  it("shows the API's message when the page cannot be read", async () => {
    (await open('/network/7/suppliers')).flush(
      { error: { code: 'not_found', message: 'Network version 7 does not exist.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'Network version 7 does not exist.',
    );
  });
});
