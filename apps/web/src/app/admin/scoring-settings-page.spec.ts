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
import { SCORING_DEFAULTS, type ScoringSettings } from '@keelson/scoring';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { ScoringSettingsPage, percentOf, shareOf } from './scoring-settings-page';

/** Settings an admin saved earlier (not the defaults, so "Restore defaults" shows a change). */
const STORED: ScoringSettings = {
  impactBandLimits: [0.002, 0.01, 0.03, 0.08],
  likelihoodWeights: {
    financialHealth: 2,
    deliveryScore: 1,
    continuityPlan: 1,
    alternatives: 3,
    countryHazard: 1,
  },
  ratingBandFloors: { medium: 5, high: 10, critical: 20 },
  unknownCountryHazard: 4,
};

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('ScoringSettingsPage', () => {
  let fixture: ComponentFixture<ScoringSettingsPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function field(label: string): HTMLElement {
    return [...root.querySelectorAll<HTMLElement>('mat-form-field')].find(
      (candidate) => words(candidate.querySelector('mat-label')!) === label,
    )!;
  }

  function input(label: string): HTMLInputElement {
    return field(label).querySelector('input')!;
  }

  async function type(label: string, value: string): Promise<void> {
    const box = input(label);
    box.value = value;
    box.dispatchEvent(new Event('input'));
    box.dispatchEvent(new Event('blur'));
    await settle();
  }

  function button(label: string): HTMLButtonElement {
    return [...root.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
      words(candidate).includes(label),
    )!;
  }

  async function save(): Promise<TestRequest> {
    button('Save and re-score').click();
    await settle();
    const put = backend.expectOne('/api/settings/scoring');
    expect(put.request.method).toBe('PUT');
    return put;
  }

  function criticalCells(): number {
    return root.querySelectorAll('.scoring__matrix td[data-band="critical"]').length;
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ScoringSettingsPage],
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
    fixture = TestBed.createComponent(ScoringSettingsPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne('/api/settings/scoring').flush(STORED);
    await settle();
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('converts between the stored shares and the percentages shown', () => {
    expect([0.001, 0.005, 0.02, 0.05].map(percentOf)).toEqual([0.1, 0.5, 2, 5]);
    expect([0.1, 0.5, 2, 5, 0.3].map(shareOf)).toEqual([0.001, 0.005, 0.02, 0.05, 0.003]);
  });

  it('shows the stored settings, the limits as percentages and each weight share', () => {
    expect(['Band 1 below', 'Band 2 below', 'Band 3 below', 'Band 4 below'].map(
      (label) => input(label).value,
    )).toEqual(['0.2', '1', '3', '8']);
    expect(words(field('Band 2 below').querySelector('mat-hint')!)).toBe('from 0.2 %');
    expect(input('Qualified alternatives').value).toBe('3');
    expect(words(field('Qualified alternatives').querySelector('mat-hint')!)).toBe(
      '38 % of the total',
    );
    expect(input('Critical from').value).toBe('20');
    expect(words(root)).toContain('scores every register entry again');
    expect(words(root)).toContain('not a standard');
  });

  it('puts the edited settings with the limits back as shares', async () => {
    await type('Band 1 below', '0.3');
    await type('Delivery score', '2');
    const put = await save();
    expect(put.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(put.request.body).toEqual({
      ...STORED,
      impactBandLimits: [0.003, 0.01, 0.03, 0.08],
      likelihoodWeights: { ...STORED.likelihoodWeights, deliveryScore: 2 },
    });
    put.flush(put.request.body);
    await settle();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain(
      'The register is scored again',
    );
  });

  it('shows the server refusal at the field and the group it names', async () => {
    await type('Band 3 below', '0.5');
    const put = await save();
    put.flush(
      {
        error: {
          code: 'invalid_request',
          message:
            'The request is not valid: body.impactBandLimits.2: each impact band limit must be ' +
            'larger than the one before',
          details: {
            issues: [
              {
                path: 'body.impactBandLimits.2',
                message: 'each impact band limit must be larger than the one before',
              },
              {
                path: 'body.ratingBandFloors',
                message: 'the band floors must increase: medium < high < critical',
              },
            ],
          },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(words(field('Band 3 below').querySelector('mat-error')!)).toBe(
      'each impact band limit must be larger than the one before',
    );
    expect(field('Band 2 below').querySelector('mat-error')).toBeNull();
    const groupErrors = [...root.querySelectorAll('.scoring__group-error')].map(words);
    expect(groupErrors).toEqual(['the band floors must increase: medium < high < critical']);
    expect(words(root.querySelector('.kl-error-banner')!)).toContain('body.impactBandLimits.2');

    await type('Band 3 below', '3');
    expect(field('Band 3 below').querySelector('mat-error')).toBeNull();
    expect(root.querySelectorAll('.scoring__group-error')).toHaveLength(0);
  });

  it('sends nothing while a field is out of range', async () => {
    await type('Medium from', '1');
    button('Save and re-score').click();
    await settle();
    backend.expectNone('/api/settings/scoring');
    expect(words(field('Medium from').querySelector('mat-error')!)).toBe(
      'Enter a whole number from 2 to 25.',
    );
  });

  it('colours the matrix preview with the floors being edited', async () => {
    // Default floors: critical from 20 is 4x5, 5x4 and 5x5.
    expect(criticalCells()).toBe(3);
    await type('Critical from', '16');
    // 16 adds 4x4.
    expect(criticalCells()).toBe(4);
    expect(words(root.querySelector('figcaption')!)).toContain('4 critical cells');
    // Row 2 is likelihood 4; cell 5 (after the row header) is impact band 4.
    const row = root.querySelectorAll('.scoring__matrix tbody tr')[1]!;
    const cell = row.querySelectorAll<HTMLElement>('td')[3];
    expect(cell?.getAttribute('data-band')).toBe('critical');
    expect(words(cell!)).toBe('▲ 16');
  });

  it('restores the defaults in the form and saves them as they are', async () => {
    button('Restore defaults').click();
    await settle();
    expect(input('Band 1 below').value).toBe('0.1');
    expect(input('Financial health').value).toBe('0.25');
    const put = await save();
    expect(put.request.body).toEqual(SCORING_DEFAULTS);
    put.flush(SCORING_DEFAULTS);
    await settle();
  });
});
