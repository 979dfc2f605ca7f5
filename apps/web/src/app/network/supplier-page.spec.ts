import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PLANTS, SUPPLIER_DETAIL } from './network-fixtures';
import { SupplierPage } from './supplier-page';

/** A cell's visible words: icon ligatures left out, white space collapsed. */
function words(node: Element): string {
  const copy = node.cloneNode(true) as Element;
  copy.querySelectorAll('mat-icon').forEach((icon) => icon.remove());
  return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
}

function cells(row: Element): string[] {
  return [...row.querySelectorAll('td')].map(words);
}

/** The label -> value pairs of a description list. */
function facts(list: Element): Record<string, string> {
  return Object.fromEntries(
    [...list.querySelectorAll('dt')].map((term) => [words(term), words(term.nextElementSibling!)]),
  );
}

describe('SupplierPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function table(label: string): HTMLTableElement {
    return root.querySelector<HTMLTableElement>(`table[aria-label="${label}"]`)!;
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [{ path: 'network/:versionId/suppliers/:code', component: SupplierPage }],
          withComponentInputBinding(),
        ),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create('/network/7/suppliers/S-0101');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
  });

  afterEach(() => backend.verify());

  async function showDetail(): Promise<void> {
    backend.expectOne('/api/network-versions/7/suppliers/S-0101').flush(SUPPLIER_DETAIL);
    await settle();
  }

  it('shows who the supplier is, its tier explained and the plants it serves', async () => {
    await showDetail();
    expect(root.querySelector('h1')?.textContent).toContain('Orvik Castings');
    expect(root.querySelector('h1')?.textContent).toContain('S-0101');
    expect(facts(root.querySelector('.supplier__facts')!)).toEqual({
      Country: 'DE',
      Region: 'Europe',
      Tier: '1',
      'Time to recover': '12 weeks',
      'Financial health': '62',
      'Delivery score': '91',
      'Continuity plan': 'Yes',
    });
    expect(root.textContent).toContain('Tier 1: it sells directly to one of your plants.');
    const plants = [...root.querySelectorAll('.supplier__plants li')].map((item) =>
      item.textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(plants).toEqual(['P-NORTH · Varnholm Works', 'P-SOUTH · Castellar Works']);
  });

  it('lists what it sells, flags a single source and links a buying supplier', async () => {
    await showDetail();
    const rows = [...table('What it sells').querySelectorAll('tr.mat-mdc-row')];
    expect(rows.map(cells)).toEqual([
      ['I-100', 'P-NORTH Varnholm Works', 'Plant', '100 %', 'Yes', '1 Single source'],
      ['I-220', 'S-0300 Halden Gears', 'Supplier', '40 %', 'Yes', '3'],
    ]);
    expect(rows[0]!.querySelector('a')).toBeNull();
    expect(rows[1]!.querySelector('a')?.getAttribute('href')).toBe('/network/7/suppliers/S-0300');
  });

  it('lists what it buys with links to its suppliers, its attributes and its import', async () => {
    await showDetail();
    const rows = [...table('What it buys').querySelectorAll('tr.mat-mdc-row')];
    expect(rows.map(cells)).toEqual([['R-7', 'S-0555 Brekka Alloys', '—', 'Yes', '2']]);
    expect(rows[0]!.querySelector('a')?.getAttribute('href')).toBe('/network/7/suppliers/S-0555');
    expect(facts(root.querySelector('.supplier__attributes')!)).toEqual({
      'Account manager': 'Lene Dahl',
      Incoterm: 'FCA',
    });
    const source = root.querySelector('.supplier__source')!.textContent!.replace(/\s+/g, ' ');
    expect(source).toContain('From import tarnwell-network-7.xlsx by Bruno Keller on');
    expect(source).toContain('row 2');
  });

  it('says so when a supplier sells nothing and has no tier', async () => {
    backend.expectOne('/api/network-versions/7/suppliers/S-0101').flush({
      ...SUPPLIER_DETAIL,
      tier: null,
      plants: [],
      sells: [],
      buys: [],
      attributes: {},
    });
    await settle();
    expect(root.textContent).toContain('No tier: none of its sales lead to one of your plants.');
    expect(root.textContent).toContain('No sourcing row names it as a seller.');
    expect(table('What it sells')).toBeNull();
    expect(root.querySelector('.supplier__attributes')).toBeNull();
  });

  it("shows the API's message for an unknown supplier", async () => {
    backend
      .expectOne('/api/network-versions/7/suppliers/S-0101')
      .flush(
        { error: { code: 'not_found', message: 'No supplier S-0101 in network version 7.' } },
        { status: 404, statusText: 'Not Found' },
      );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'No supplier S-0101 in network version 7.',
    );
  });
});
