import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { REGISTER_BATCH_SIZE } from './register-api';
import { registerEntry } from './register-fixtures';
import { RegisterPrintPage } from './register-print-page';

function params(request: TestRequest): Record<string, string> {
  const { params: httpParams } = request.request;
  return Object.fromEntries(httpParams.keys().map((key) => [key, httpParams.get(key) ?? '']));
}

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

/** `count` entries numbered from `first`, alternating ratings so every band shows up. */
function entries(first: number, count: number) {
  return Array.from({ length: count }, (_, index) =>
    registerEntry(first + index, {
      impactBand: 1 + (index % 5),
      computedLikelihood: 5 - (index % 5),
      likelihoodOverride: index === 1 ? 4 : null,
    }),
  );
}

describe('RegisterPrintPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  function expectPage(): TestRequest {
    return backend.expectOne((request) => request.url === '/api/register');
  }

  async function open(url: string): Promise<void> {
    harness = await RouterTestingHarness.create(url);
    root = harness.routeNativeElement!;
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([{ path: 'register/print', component: RegisterPrintPage }]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('reads every matching entry in pages of 1000 and renders them all', async () => {
    await open('/register/print?status=open&plant=P-NORTH&sort=updatedAt&order=asc');
    const first = expectPage();
    expect(params(first)).toEqual({
      status: 'open',
      plant: 'P-NORTH',
      sort: 'updatedAt',
      order: 'asc',
      limit: String(REGISTER_BATCH_SIZE),
      offset: '0',
    });
    first.flush({ items: entries(1, 1000), total: 1003 });
    await settle();
    const second = expectPage();
    expect(params(second)).toMatchObject({ status: 'open', limit: '1000', offset: '1000' });
    second.flush({ items: entries(1001, 3), total: 1003 });
    await settle();
    backend.expectNone((request) => request.url === '/api/register');

    const rows = root.querySelectorAll('tbody tr');
    expect(rows).toHaveLength(1003);
    expect(words(rows[1002]!.querySelector('td')!)).toBe('1003');
    expect([...rows[1]!.querySelectorAll('td')].map(words).slice(6, 9)).toEqual([
      '4*',
      '2',
      '◐ 8 Medium',
    ]);
    expect(words(root.querySelector('h1')!)).toBe('Risk register');
    expect(words(root.querySelector('.register-print__heading')!)).toContain('1003 entries');
    expect(words(root.querySelector('.register-print__filters')!)).toBe(
      'Status: Open · Plant: P-NORTH · sorted by last update, ascending',
    );
    expect(words(root.querySelector('footer')!)).toContain('* likelihood overridden');
    expect(words(root.querySelector('footer')!)).toContain('not a standard');
  });

  it('stops after one page when everything fits, and says when nothing matches', async () => {
    await open('/register/print?ratingBand=critical');
    const only = expectPage();
    expect(params(only)).toMatchObject({ ratingBand: 'critical', sort: 'rating', order: 'desc' });
    only.flush({ items: [], total: 0 });
    await settle();
    expect(words(root.querySelector('tbody')!)).toBe('No entry matches these filters.');
    expect(words(root.querySelector('.register-print__filters')!)).toBe(
      'Rating band: Critical · sorted by rating, descending',
    );
  });

  it('opens the browser print dialog from its button', async () => {
    const print = vi.spyOn(window, 'print').mockImplementation(() => undefined);
    await open('/register/print');
    expectPage().flush({ items: entries(1, 2), total: 2 });
    await settle();
    const button = [...root.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
      words(candidate).includes('Print or save as PDF'),
    )!;
    button.click();
    expect(print).toHaveBeenCalledTimes(1);
    print.mockRestore();
  });

  it('carries its filters back to the register', async () => {
    await open('/register/print?q=cast&status=accepted');
    expectPage().flush({ items: [], total: 0 });
    await settle();
    const back = root.querySelector<HTMLAnchorElement>('a')!;
    expect(back.getAttribute('href')).toBe('/register?q=cast&status=accepted');
  });
});
