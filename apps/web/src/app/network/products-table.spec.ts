import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { NetworkProductDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { PLANTS } from './network-fixtures';
import { ProductsTable } from './products-table';

const PRODUCTS: NetworkProductDto[] = [
  {
    code: 'FP-10',
    name: 'Hydraulic pump HP-10',
    plantCode: 'P-NORTH',
    weeklyRevenue: 42_000,
    componentCount: 6,
    row: 2,
  },
];

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

describe('ProductsTable', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectProducts(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/network-versions/5/products');
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          {
            path: 'network/:versionId',
            children: [{ path: 'products', component: ProductsTable }],
          },
        ]),
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

  it('renders products with a link to each bill of materials at its plant', async () => {
    harness = await RouterTestingHarness.create('/network/5/products');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    expectProducts().flush({ items: PRODUCTS, total: 1 });
    await settle();
    const cells = [...root.querySelectorAll('tr.mat-mdc-row td')].map((cell) =>
      cell.textContent?.trim(),
    );
    expect(cells).toEqual(['FP-10', 'Hydraulic pump HP-10', 'P-NORTH', '42,000', '6']);
    expect(root.querySelector('tr.mat-mdc-row a')?.getAttribute('href')).toBe(
      '/network/5/products/FP-10?plant=P-NORTH',
    );
  });

  it('sends plant, search, sort and page from the URL and changes page on the server', async () => {
    harness = await RouterTestingHarness.create(
      '/network/5/products?q=pump&plant=P-SOUTH&sort=weeklyRevenue&order=desc&limit=100',
    );
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    const first = expectProducts();
    expect(params(first)).toEqual({
      q: 'pump',
      plant: 'P-SOUTH',
      sort: 'weeklyRevenue',
      order: 'desc',
      limit: '100',
      offset: '0',
    });
    first.flush({ items: PRODUCTS, total: 250 });
    await settle();
    root.querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-last')!.click();
    await settle();
    const last = expectProducts();
    expect(params(last)).toMatchObject({ limit: '100', offset: '200' });
    last.flush({ items: PRODUCTS, total: 250 });
  });

  it("offers a plant manager only their own plants in the plant filter", async () => {
    TestBed.inject(Session).signIn(userWithRole('plant_manager'));
    harness = await RouterTestingHarness.create('/network/5/products');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    expectProducts().flush({ items: PRODUCTS, total: 1 });
    await settle();
    root.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    const options = [...document.querySelectorAll('mat-option')].map((option) =>
      option.textContent?.trim(),
    );
    expect(options).toEqual(['All plants', 'P-NORTH · Varnholm Works']);
  });
});
