import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  HttpTestingController,
  type TestRequest,
  provideHttpClientTesting,
} from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { COUNTRIES, supplierRow, version } from '../network/network-fixtures';
import { SEARCH_DEBOUNCE_MS } from '../network/url-table-state';
import { versionLabel } from '../network/version-label';
import { userWithRole } from '../testing/user-fixtures';
import { scenarioResult, scenarioRow } from './runs-fixtures';
import { ScenariosPage } from './scenarios-page';

describe('ScenariosPage', () => {
  let fixture: ComponentFixture<ScenariosPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  async function open(role: Role, saved = [scenarioRow(2, { name: 'Shared casting plant' })]):
    Promise<void> {
    TestBed.inject(Session).signIn(userWithRole(role));
    fixture = TestBed.createComponent(ScenariosPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    const versions = backend.expectOne((request) => request.url === '/api/network-versions');
    expect(versions.request.params.get('limit')).toBe('100');
    versions.flush({ items: [version(5, { isLatest: true }), version(4, { isLatest: false })],
      total: 2 });
    backend.expectOne('/api/countries').flush(COUNTRIES);
    backend.expectOne('/api/scenarios').flush({ items: saved });
    await settle();
  }

  function button(label: string, scope: ParentNode = root): HTMLButtonElement | undefined {
    return [...scope.querySelectorAll<HTMLButtonElement>('button')].find(
      (candidate) => candidate.textContent?.trim() === label,
    );
  }

  function field(label: string): HTMLElement {
    return [...root.querySelectorAll<HTMLElement>('mat-form-field')].find((candidate) =>
      candidate.querySelector('mat-label')?.textContent?.includes(label),
    )!;
  }

  async function choose(label: string, option: string): Promise<void> {
    field(label).querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((candidate) => candidate.textContent?.trim() === option)!
      .click();
    await settle();
  }

  function closeOverlays(): void {
    document.body.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape' }));
    document.querySelector<HTMLElement>('.cdk-overlay-backdrop')?.click();
  }

  async function addSupplier(text: string, code: string): Promise<TestRequest> {
    const input = field('Add a supplier').querySelector<HTMLInputElement>('input')!;
    input.focus();
    input.dispatchEvent(new Event('focusin'));
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await new Promise((resolve) => setTimeout(resolve, SEARCH_DEBOUNCE_MS + 50));
    const search = backend.expectOne(
      (request) => request.url === '/api/network-versions/5/suppliers',
    );
    search.flush({ items: [supplierRow(code, { name: 'Tarn Shared Castings' })], total: 1 });
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((candidate) => candidate.textContent?.includes(code))!
      .click();
    await settle();
    return search;
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
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

  it('evaluates a failure set of a searched supplier and a country on the latest version',
    async () => {
      await open('viewer');
      expect(button('Evaluate')!.disabled).toBe(true);
      const search = await addSupplier('shared', 'S-2-SHARED-A');
      expect(search.request.params.get('q')).toBe('shared');
      expect(root.querySelector('mat-chip-row')?.textContent).toContain('S-2-SHARED-A');
      await choose('Countries', 'VN · Viet Nam');
      closeOverlays();
      await settle();

      button('Evaluate')!.click();
      await settle();
      const evaluate = backend.expectOne('/api/network-versions/5/scenario');
      expect(evaluate.request.method).toBe('POST');
      expect(evaluate.request.body).toEqual({
        suppliers: ['S-2-SHARED-A'], countries: ['VN'], regions: [],
      });
      evaluate.flush(scenarioResult(5));
      await settle();

      const figures = [...root.querySelectorAll('.scenario-result__figures dd')].map((cell) =>
        cell.textContent?.trim(),
      );
      expect(figures).toEqual(['1', '42,000', '210,000', '8 weeks']);
      const product = [...root.querySelectorAll('table[aria-label="Lost products"] td')].map(
        (cell) => cell.textContent?.trim(),
      );
      expect(product).toEqual(['FG-100', 'P-NORTH', '42,000', '3', '5']);
      expect(root.querySelector('ul[aria-label="Failure paths"]')?.textContent?.trim()).toBe(
        'S-2-SHARED-A → IT-7 → FG-100',
      );
      expect(root.textContent).toContain('no other source takes over its share');
      // Viewers evaluate but do not save or delete.
      expect(button('Save')).toBeUndefined();
      expect(button('Delete')).toBeUndefined();
    });

  it('shows the API\'s message when the failure set cannot be evaluated', async () => {
    await open('viewer');
    await choose('Regions', 'Asia');
    closeOverlays();
    await settle();
    button('Evaluate')!.click();
    const evaluate = backend.expectOne('/api/network-versions/5/scenario');
    expect(evaluate.request.body).toEqual({ suppliers: [], countries: [], regions: ['Asia'] });
    evaluate.flush(
      { error: { code: 'not_found', message: 'Network version 5 does not exist.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'Network version 5 does not exist.',
    );
  });

  it('saves the failure set under a name for risk managers', async () => {
    await open('risk_manager', []);
    await addSupplier('shared', 'S-2-SHARED-B');
    const name = field('Scenario name').querySelector<HTMLInputElement>('input')!;
    name.value = 'Second casting plant';
    name.dispatchEvent(new Event('input'));
    await settle();
    button('Save')!.click();
    const save = backend.expectOne('/api/scenarios');
    expect(save.request.method).toBe('POST');
    expect(save.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(save.request.body).toEqual({
      name: 'Second casting plant', suppliers: ['S-2-SHARED-B'], countries: [], regions: [],
    });
    const created = scenarioRow(8, { name: 'Second casting plant', suppliers: ['S-2-SHARED-B'],
      countries: [] });
    save.flush(created, { status: 201, statusText: 'Created' });
    await settle();
    backend.expectOne('/api/scenarios').flush({ items: [created] });
    await settle();
    expect(root.querySelector('[role="status"]')?.textContent).toContain(
      'Saved “Second casting plant”.',
    );
    expect(root.querySelector('.scenarios__saved')?.textContent).toContain(
      'Second casting plant · 1 supplier, 0 countries, 0 regions',
    );
  });

  it('reruns a saved scenario on another version', async () => {
    await open('risk_manager');
    await choose('Network version', versionLabel(version(4)));
    button('Evaluate on the chosen version')!.click();
    await settle();
    const evaluate = backend.expectOne('/api/network-versions/4/scenario');
    expect(evaluate.request.body).toEqual({
      suppliers: ['S-2-SHARED-A'], countries: ['VN'], regions: [],
    });
    evaluate.flush(scenarioResult(4));
    await settle();
    expect(root.querySelector('#result-title')?.textContent).toBe('On version 4');
    expect(root.querySelector('mat-chip-row')?.textContent).toContain('S-2-SHARED-A');
  });

  it('deletes a saved scenario after confirmation', async () => {
    await open('admin');
    button('Delete')!.click();
    await settle();
    const dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
    expect(dialog.textContent).toContain('“Shared casting plant” will no longer be listed.');
    button('Delete', dialog)!.click();
    await settle();
    const remove = backend.expectOne('/api/scenarios/2');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null, { status: 204, statusText: 'No Content' });
    await settle();
    backend.expectOne('/api/scenarios').flush({ items: [] });
    await settle();
    expect(root.textContent).toContain('No saved scenario yet.');
  });
});
