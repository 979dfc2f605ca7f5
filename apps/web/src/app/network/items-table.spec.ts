import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { NetworkItemDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ItemsTable } from './items-table';
import { PLANTS } from './network-fixtures';
import { SEARCH_DEBOUNCE_MS } from './url-table-state';

const ITEMS: NetworkItemDto[] = [
  {
    code: 'A-200',
    holderCode: 'P-NORTH',
    holderKind: 'plant',
    kind: 'made',
    qualifiedSources: 0,
    usedIn: 3,
    weeksOfCover: null,
  },
  {
    code: 'I-100',
    holderCode: 'P-NORTH',
    holderKind: 'plant',
    kind: 'bought',
    qualifiedSources: 1,
    usedIn: 2,
    weeksOfCover: 2.5,
  },
  {
    code: 'R-7',
    holderCode: 'S-0101',
    holderKind: 'supplier',
    kind: 'bought',
    qualifiedSources: 3,
    usedIn: 0,
    weeksOfCover: null,
  },
];

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

function words(node: Element): string {
  const copy = node.cloneNode(true) as Element;
  copy.querySelectorAll('mat-icon').forEach((icon) => icon.remove());
  return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('ItemsTable', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectItems(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/network-versions/5/items');
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'network/:versionId', children: [{ path: 'items', component: ItemsTable }] },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create('/network/5/items');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    const first = expectItems();
    expect(params(first)).toEqual({ sort: 'code', order: 'asc', limit: '25', offset: '0' });
    first.flush({ items: ITEMS, total: 3 });
    await settle();
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('flags single sources and links BOMs of made items and supplier holders', () => {
    const rows = [...root.querySelectorAll('tr.mat-mdc-row')];
    expect(rows.map((row) => [...row.querySelectorAll('td')].map(words))).toEqual([
      ['A-200', 'P-NORTH', 'Plant', 'Made', '—', '3', '—'],
      ['I-100', 'P-NORTH', 'Plant', 'Bought', '1 Single source', '2', '2.5'],
      ['R-7', 'S-0101', 'Supplier', 'Bought', '3', '0', '—'],
    ]);
    expect(rows[0]!.querySelector('a')?.getAttribute('href')).toBe(
      '/network/5/products/A-200?plant=P-NORTH',
    );
    expect(rows[1]!.querySelector('a')).toBeNull();
    expect(rows[2]!.querySelector('a')?.getAttribute('href')).toBe('/network/5/suppliers/S-0101');
  });

  it('asks for bought, single-sourced items at a plant, searched and sorted', async () => {
    const trigger = (label: string): HTMLElement =>
      [...root.querySelectorAll('mat-form-field')]
        .find((field) => field.querySelector('mat-label')?.textContent?.includes(label))!
        .querySelector<HTMLElement>('.mat-mdc-select-trigger')!;
    const pick = async (label: string, option: string): Promise<void> => {
      trigger(label).click();
      await settle();
      [...document.querySelectorAll<HTMLElement>('mat-option')]
        .find((candidate) => words(candidate) === option)!
        .click();
      await settle();
      expectItems().flush({ items: ITEMS.slice(1), total: 2 });
      await settle();
    };
    await pick('Kind', 'Bought');
    await pick('Plant', 'P-NORTH · Varnholm Works');

    root.querySelector<HTMLInputElement>('mat-checkbox input')!.click();
    await settle();
    const single = expectItems();
    expect(params(single)).toEqual({
      plant: 'P-NORTH',
      kind: 'bought',
      singleSourced: 'true',
      sort: 'code',
      order: 'asc',
      limit: '25',
      offset: '0',
    });
    single.flush({ items: [ITEMS[1]], total: 1 });
    await settle();

    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 'I-1';
    input.dispatchEvent(new Event('input'));
    await new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
    await settle();
    const search = expectItems();
    expect(params(search)).toMatchObject({ q: 'I-1', singleSourced: 'true', offset: '0' });
    search.flush({ items: [ITEMS[1]], total: 1 });
    await settle();

    [...root.querySelectorAll<HTMLElement>('th')]
      .find((cell) => cell.textContent?.includes('Weeks of cover'))!
      .click();
    await settle();
    const sorted = expectItems();
    expect(params(sorted)).toMatchObject({ sort: 'weeksOfCover', order: 'asc' });
    sorted.flush({ items: [ITEMS[1]], total: 1 });
    expect(TestBed.inject(Router).url).toBe(
      '/network/5/items?q=I-1&plant=P-NORTH&kind=bought&singleSourced=true' +
        '&sort=weeksOfCover&order=asc',
    );
  });
});
