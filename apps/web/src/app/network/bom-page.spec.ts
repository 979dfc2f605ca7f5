import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { BomNodeDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BomPage } from './bom-page';
import { BOM_ROOT, link } from './network-fixtures';

/** A-200 is made at P-NORTH from one bought part (two qualified sources) and one made part. */
const ASSEMBLY: BomNodeDto = {
  code: 'A-200',
  kind: 'made',
  plantCode: 'P-NORTH',
  name: null,
  children: [
    {
      code: 'I-310',
      qtyPer: 2,
      kind: 'bought',
      qualifiedSources: 2,
      weeksOfCover: 6,
      hasChildren: false,
    },
    { code: 'A-320', qtyPer: 1, kind: 'made', qualifiedSources: null, weeksOfCover: null,
      hasChildren: false },
  ],
  sources: [],
};

/** I-100 is bought at P-NORTH from one qualified supplier. */
const BOUGHT_PART: BomNodeDto = {
  code: 'I-100',
  kind: 'bought',
  plantCode: 'P-NORTH',
  name: null,
  children: [],
  sources: [link({ itemCode: 'I-100', supplierCode: 'S-0101', qualifiedSources: 1 })],
};

const BOM_URL = '/api/network-versions/7/bom/';

describe('BomPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  /** The visible lines as "level code|text", icon ligatures left out. */
  function lines(): string[] {
    return [...root.querySelectorAll('tbody tr')].map((row) => {
      const text = [...row.querySelectorAll('td')].map((cell) => {
        const copy = cell.cloneNode(true) as Element;
        copy.querySelectorAll('mat-icon').forEach((icon) => icon.remove());
        return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
      });
      return `${row.getAttribute('aria-level')} ${text.join(' ')}`;
    });
  }

  async function toggle(label: string): Promise<void> {
    root.querySelector<HTMLButtonElement>(`button[aria-label="${label}"]`)!.click();
    await settle();
  }

  function expectBom(code: string) {
    const request = backend.expectOne((candidate) => candidate.url === BOM_URL + code);
    expect(request.request.params.get('plant')).toBe('P-NORTH');
    return request;
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [
            {
              path: 'network/:versionId',
              children: [{ path: 'products/:code', component: BomPage }],
            },
          ],
          withComponentInputBinding(),
        ),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create('/network/7/products/FP-10?plant=P-NORTH');
    root = harness.routeNativeElement!;
    await settle();
    expectBom('FP-10').flush(BOM_ROOT);
    await settle();
  });

  afterEach(() => backend.verify());

  it('shows the first level with qty per, made or bought, sources and cover', () => {
    expect(root.querySelector('h2')?.textContent).toContain('Hydraulic pump HP-10');
    expect(lines()).toEqual([
      '1 A-200 1 Made — —',
      '1 I-100 4 Bought 1 Single source 2.5',
    ]);
    backend.expectNone((request) => request.url.startsWith(BOM_URL));
  });

  it('fetches a made line\'s components only when it is opened, and only once', async () => {
    await toggle('Open A-200');
    expect(lines()).toEqual([
      '1 A-200 1 Made — —',
      '2 Loading…',
      '1 I-100 4 Bought 1 Single source 2.5',
    ]);
    expectBom('A-200').flush(ASSEMBLY);
    await settle();
    expect(lines()).toEqual([
      '1 A-200 1 Made — —',
      '2 I-310 2 Bought 2 6',
      '2 A-320 1 Made — —',
      '1 I-100 4 Bought 1 Single source 2.5',
    ]);
    expect(root.querySelector('tr[aria-level="1"]')?.getAttribute('aria-expanded')).toBe('true');
    // A-320 has no components: nothing to open.
    expect(root.querySelector('button[aria-label="Open A-320"]')).toBeNull();

    await toggle('Close A-200');
    expect(lines()).toHaveLength(2);
    await toggle('Open A-200');
    expect(lines()).toHaveLength(4);
    backend.expectNone((request) => request.url === BOM_URL + 'A-200');
  });

  it('lists the suppliers of a bought line, each linking to its page', async () => {
    await toggle('Open I-100');
    expectBom('I-100').flush(BOUGHT_PART);
    await settle();
    expect(lines()[2]).toBe('2 S-0101 Orvik Castings · share 100 % · qualified');
    const supplier = root.querySelector<HTMLAnchorElement>('tr[aria-level="2"] a')!;
    expect(supplier.getAttribute('href')).toBe('/network/7/suppliers/S-0101');
  });

  it('shows a failed level in place and asks again when it is reopened', async () => {
    await toggle('Open A-200');
    expectBom('A-200').flush(
      { error: { code: 'not_found', message: 'No item A-200 at plant P-NORTH.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await settle();
    expect(root.querySelector('td[role="alert"]')?.textContent).toContain(
      'No item A-200 at plant P-NORTH.',
    );
    await toggle('Close A-200');
    await toggle('Open A-200');
    expectBom('A-200').flush(ASSEMBLY);
    await settle();
    expect(lines()).toHaveLength(4);
  });
});
