import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { CountryDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { CountriesPage } from './countries-page';

/** Countries as GET /api/countries lists them; the ratings are invented placeholders. */
const COUNTRIES: CountryDto[] = [
  {
    code: 'DE',
    name: 'Germany',
    region: 'Europe',
    hazard: 2,
    isDefault: true,
    updatedAt: '2026-11-01T09:00:00.000Z',
    updatedBy: null,
  },
  {
    code: 'VN',
    name: 'Viet Nam',
    region: 'Asia',
    hazard: 4,
    isDefault: false,
    updatedAt: '2026-11-20T14:30:00.000Z',
    updatedBy: 'Alma Reyes',
  },
];

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('CountriesPage', () => {
  let fixture: ComponentFixture<CountriesPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function row(code: string): HTMLElement {
    return [...root.querySelectorAll<HTMLElement>('tr.mat-mdc-row')].find(
      (candidate) => words(candidate.querySelector('td')!) === code,
    )!;
  }

  async function chooseHazard(code: string, label: string): Promise<void> {
    row(code).querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((option) => words(option) === label)!
      .click();
    await settle();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [CountriesPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    TestBed.inject(Session).signIn(userWithRole('admin'));
    fixture = TestBed.createComponent(CountriesPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne('/api/countries').flush(COUNTRIES);
    await settle();
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('lists each country with its rating, the placeholder mark and who changed it', () => {
    const germany = [...row('DE').querySelectorAll('td')].map(words);
    expect(germany.slice(0, 3)).toEqual(['DE', 'Germany', 'Europe']);
    expect(germany[3]).toContain('2');
    expect(germany[4]).toContain('default (invented placeholder)');
    const vietnam = [...row('VN').querySelectorAll('td')].map(words);
    expect(vietnam[4]).toBe('reviewed');
    expect(vietnam[5]).toContain('by Alma Reyes');
    expect(root.textContent).toContain('invented placeholders');
    expect(root.textContent).toContain('1 still to review.');
  });

  it('saves a new hazard with PUT and the CSRF header, then shows the saved row', async () => {
    await chooseHazard('DE', '4');
    const put = backend.expectOne('/api/countries/DE');
    expect(put.request.method).toBe('PUT');
    expect(put.request.body).toEqual({ hazard: 4 });
    expect(put.request.headers.get('x-keelson-csrf')).toBe('1');
    put.flush({ ...COUNTRIES[0], hazard: 4, isDefault: false, updatedBy: 'Alma Reyes' });
    await settle();
    expect(words(row('DE').querySelectorAll('td')[4]!)).toBe('reviewed');
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain(
      'Germany: hazard 4 saved.',
    );
    expect(root.textContent).not.toContain('still to review');
  });

  it('keeps a shipped default as reviewed by saving the same rating', async () => {
    row('DE').querySelector<HTMLButtonElement>('button[aria-label="Keep hazard 2 for Germany"]')!
      .click();
    await settle();
    const put = backend.expectOne('/api/countries/DE');
    expect(put.request.body).toEqual({ hazard: 2 });
    put.flush({ ...COUNTRIES[0], isDefault: false });
    await settle();
    expect(words(row('DE').querySelectorAll('td')[4]!)).toBe('reviewed');
  });

  it('puts the stored rating back and says why when the save is refused', async () => {
    await chooseHazard('VN', '5 · high');
    backend
      .expectOne('/api/countries/VN')
      .flush(
        { error: { code: 'forbidden', message: 'This needs the role Administrator.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await settle();
    expect(words(row('VN').querySelector('.mat-mdc-select-value')!)).toBe('4');
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain(
      'Viet Nam was not saved: This needs the role Administrator.',
    );
  });

  it('filters the table by code, name or region as you type', async () => {
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 'asia';
    input.dispatchEvent(new Event('input'));
    await settle();
    expect([...root.querySelectorAll('tr.mat-mdc-row')].map((tr) => words(tr.querySelector('td')!)))
      .toEqual(['VN']);
  });
});
