import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { version } from './network-fixtures';
import { NetworkVersionPage } from './network-version-page';

@Component({ selector: 'kl-tab-stand-in', template: 'tab content' })
class TabStandIn {}

function words(node: Element | null | undefined): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('NetworkVersionPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(
          [
            {
              path: 'network/:versionId',
              component: NetworkVersionPage,
              children: [
                { path: 'suppliers', component: TabStandIn },
                { path: 'items', component: TabStandIn },
              ],
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
    TestBed.inject(Session).signIn(userWithRole('buyer'));
    harness = await RouterTestingHarness.create('/network/3/items');
    root = harness.routeNativeElement!;
    await settle();
    const list = backend.expectOne((request) => request.url === '/api/network-versions');
    expect(list.request.params.get('limit')).toBe('100');
    list.flush({ items: [version(3), version(2, { isLatest: false })], total: 2 });
    backend.expectOne('/api/network-versions/3').flush(version(3));
    await settle();
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('names the version in the picker with its import, file and date', () => {
    expect(words(root.querySelector('mat-select'))).toMatch(
      /^Version 3 · Import 13: tarnwell-network-3\.xlsx · 30 Nov 2026, \d\d:\d\d$/,
    );
  });

  it("shows the version's counts and what changed against the previous one", () => {
    const counts = [...root.querySelectorAll('.network__count')].map(
      (count) => `${words(count.querySelector('dt'))}: ${words(count.querySelector('dd'))}`,
    );
    expect(counts).toEqual([
      'Plants: 2',
      'Products: 14',
      'Items: 320',
      'BOM lines: 410',
      'Suppliers: 12,480',
      'Sourcing rows: 15,020',
      'Stock rows: 180',
    ]);
    const lines = [...root.querySelectorAll('.network__change-table tbody tr')].map((row) =>
      [...row.children].map(words),
    );
    expect(lines).toEqual([
      ['Suppliers', '2 S-0901, S-0902', '0', '1 S-0007'],
      ['Sourcing rows', '4', '1', '0'],
      ['Products', '0', '0', '0'],
    ]);
    expect(root.querySelector('a[href="/network/2"]')).not.toBeNull();
  });

  it('links the export of exactly this version', () => {
    const link = [...root.querySelectorAll('a')].find((anchor) =>
      anchor.textContent?.includes('Export this version (xlsx)'),
    )!;
    expect(link.getAttribute('href')).toBe('/api/network-versions/3/export.xlsx');
    expect(link.hasAttribute('download')).toBe(true);
  });

  it('offers no export to a plant manager, whom the API refuses the whole network', async () => {
    const exportLink = (): Element | undefined =>
      [...root.querySelectorAll('a')].find((anchor) => anchor.textContent?.includes('Export'));
    expect(exportLink()).toBeDefined();
    TestBed.inject(Session).signIn(userWithRole('plant_manager'));
    await settle();
    expect(exportLink()).toBeUndefined();
  });

  it('opens another version on the same tab when one is picked', async () => {
    root.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((option) => option.textContent?.includes('Version 2'))!
      .click();
    await settle();
    backend.expectOne('/api/network-versions/2').flush(version(2, { isLatest: false }));
    await settle();
    expect(TestBed.inject(Router).url).toBe('/network/2/items');
    expect(root.querySelector('.network__source')?.textContent).not.toContain('latest');
  });

  it('says when a version is the first one, with nothing to compare', async () => {
    await harness.navigateByUrl('/network/1/suppliers');
    await settle();
    backend.expectOne('/api/network-versions/1').flush(version(1));
    await settle();
    expect(root.textContent).toContain('The first version: there is nothing earlier to compare');
    expect(root.querySelector('.network__change-table')).toBeNull();
  });
});
