import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  type FormControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import {
  SCORING_DEFAULTS,
  type LikelihoodWeights,
  type RatingBand,
  type ScoringSettings,
  ratingBandOf,
} from '@keelson/scoring';
import { map } from 'rxjs';
import { BAND_LABELS, BAND_MARKERS } from '../register/register-labels';
import { ScoreNote } from '../register/score-note';
import { apiErrorMessage, isApiErrorBody } from '../shared/api-error-message';
import { ScoringSettingsApi } from './scoring-settings-api';

/** The likelihood factors in display order, with what each is called on screen. */
export const WEIGHT_FIELDS: readonly { key: keyof LikelihoodWeights; label: string }[] = [
  { key: 'financialHealth', label: 'Financial health' },
  { key: 'deliveryScore', label: 'Delivery score' },
  { key: 'continuityPlan', label: 'Continuity plan' },
  { key: 'alternatives', label: 'Qualified alternatives' },
  { key: 'countryHazard', label: 'Country hazard' },
];

/** A share (0.001) as the percentage the page shows (0.1), without floating-point noise. */
export function percentOf(share: number): number {
  return Number((share * 100).toPrecision(12));
}

/** A percentage typed on the page (0.1) as the share the API stores (0.001). */
export function shareOf(percent: number): number {
  return Number((percent / 100).toPrecision(12));
}

type Floors = ScoringSettings['ratingBandFloors'];

/**
 * Scoring settings (admin): the impact band limits as percentages of a year's revenue, the
 * likelihood weights, the rating band floors with a preview of the 5 x 5 matrix, and the hazard
 * of a country missing from the table. Saving re-scores the register; the server's refusals are
 * shown at the field they name.
 */
@Component({
  selector: 'kl-scoring-settings-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButton,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatSuffix,
    ReactiveFormsModule,
    ScoreNote,
  ],
  templateUrl: './scoring-settings-page.html',
  styleUrl: './scoring-settings-page.scss',
})
export class ScoringSettingsPage {
  private readonly settingsApi = inject(ScoringSettingsApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly builder = inject(NonNullableFormBuilder);
  private readonly number = (min: number, max: number) => [
    Validators.required,
    Validators.min(min),
    Validators.max(max),
  ];

  protected readonly weightFields = WEIGHT_FIELDS;
  protected readonly bandLabels = BAND_LABELS;
  protected readonly bandMarkers = BAND_MARKERS;
  protected readonly hazards = [1, 2, 3, 4, 5] as const;
  protected readonly floorBands = ['medium', 'high', 'critical'] as const;
  protected readonly matrixLevels = [5, 4, 3, 2, 1] as const;
  protected readonly matrixBands = [1, 2, 3, 4, 5] as const;
  protected readonly isLoading = signal(true);
  protected readonly isSaving = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  /** Server messages about a whole group (`ratingBandFloors`), by group name. */
  protected readonly groupErrors = signal<Readonly<Record<string, string>>>({});
  private readonly saved = signal<ScoringSettings>(structuredClone(SCORING_DEFAULTS));

  protected readonly form = this.builder.group({
    impactBandLimits: this.builder.array(
      [0, 1, 2, 3].map(() => this.builder.control(0, this.number(0, 100))),
    ),
    likelihoodWeights: this.builder.group({
      financialHealth: [0, this.number(0, 100)],
      deliveryScore: [0, this.number(0, 100)],
      continuityPlan: [0, this.number(0, 100)],
      alternatives: [0, this.number(0, 100)],
      countryHazard: [0, this.number(0, 100)],
    }),
    ratingBandFloors: this.builder.group({
      medium: [0, this.number(2, 25)],
      high: [0, this.number(3, 25)],
      critical: [0, this.number(4, 25)],
    }),
    unknownCountryHazard: [3, [Validators.required]],
  });

  private readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.settings())), {
    initialValue: this.settings(),
  });
  /** Each weight's share of the total, in percent (only the ratios matter). */
  protected readonly weightShares = computed(() => {
    const weights = this.value().likelihoodWeights;
    const total = Object.values(weights).reduce((sum, weight) => sum + (weight || 0), 0);
    const shares: Partial<Record<keyof LikelihoodWeights, number>> = {};
    for (const { key } of WEIGHT_FIELDS) {
      shares[key] = total > 0 ? Math.round(((weights[key] || 0) / total) * 100) : 0;
    }
    return shares;
  });
  /** The 5 x 5 matrix coloured with the floors being edited: rows likelihood 5 to 1. */
  protected readonly matrix = computed(() => {
    const settings = this.value();
    return this.matrixLevels.map((likelihood) =>
      this.matrixBands.map((impactBand) => {
        const rating = likelihood * impactBand;
        return { likelihood, impactBand, rating, band: ratingBandOf(rating, settings) };
      }),
    );
  });
  protected readonly bandCounts = computed(() => {
    const counts: Record<RatingBand, number> = { low: 0, medium: 0, high: 0, critical: 0 };
    for (const row of this.matrix()) for (const cell of row) counts[cell.band]++;
    return counts;
  });

  constructor() {
    this.form.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => {
      if (Object.keys(this.groupErrors()).length > 0) this.groupErrors.set({});
    });
    this.settingsApi.get().subscribe({
      next: (settings) => {
        this.saved.set(settings);
        this.fill(settings);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.errorMessage.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }

  protected limitControl(index: number): FormControl<number> {
    return this.form.controls.impactBandLimits.at(index);
  }

  /** The lower end of impact band `index` + 1, in percent (0 for band 1). */
  protected lowerLimit(index: number): number | null {
    return index === 0 ? 0 : (this.value().impactBandLimits[index - 1] ?? null);
  }

  protected restoreDefaults(): void {
    this.fill(SCORING_DEFAULTS);
    this.form.markAsDirty();
    this.notify('Defaults filled in. Nothing changes until you save.');
  }

  protected undo(): void {
    this.fill(this.saved());
  }

  protected save(): void {
    if (this.isSaving()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const settings = this.settings();
    const body: ScoringSettings = {
      ...settings,
      impactBandLimits: settings.impactBandLimits.map(
        shareOf,
      ) as ScoringSettings['impactBandLimits'],
    };
    this.isSaving.set(true);
    this.errorMessage.set(null);
    this.settingsApi.save(body).subscribe({
      next: (saved) => {
        this.isSaving.set(false);
        this.saved.set(saved);
        this.fill(saved);
        this.notify('Settings saved. The register is scored again with them.');
      },
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.errorMessage.set(apiErrorMessage(error));
        this.showFieldErrors(error);
      },
    });
  }

  /** The form as settings, with the impact limits still in percent. */
  private settings(): ScoringSettings {
    const value = this.form.getRawValue();
    return {
      impactBandLimits: value.impactBandLimits as ScoringSettings['impactBandLimits'],
      likelihoodWeights: value.likelihoodWeights,
      ratingBandFloors: value.ratingBandFloors as Floors,
      unknownCountryHazard: value.unknownCountryHazard,
    };
  }

  private fill(settings: Readonly<ScoringSettings>): void {
    this.form.reset({
      impactBandLimits: settings.impactBandLimits.map(percentOf),
      likelihoodWeights: { ...settings.likelihoodWeights },
      ratingBandFloors: { ...settings.ratingBandFloors },
      unknownCountryHazard: settings.unknownCountryHazard,
    });
    this.groupErrors.set({});
  }

  // The API names each problem by its path in the body (`body.impactBandLimits.2`); a path to a
  // field marks that field, a path to a group (`body.ratingBandFloors`) shows under the group.
  private showFieldErrors(error: unknown): void {
    if (!(error instanceof HttpErrorResponse) || !isApiErrorBody(error.error)) {
      return;
    }
    const details = error.error.error.details as
      | { issues?: { path?: unknown; message?: unknown }[] }
      | undefined;
    const groups: Record<string, string> = {};
    for (const issue of details?.issues ?? []) {
      if (typeof issue.path !== 'string' || typeof issue.message !== 'string') continue;
      const path = issue.path.replace(/^body\.?/, '');
      const control: AbstractControl | null = path ? this.form.get(path) : null;
      if (control && !('controls' in control)) {
        control.setErrors({ server: issue.message });
        control.markAsTouched();
      } else {
        groups[path || 'form'] = issue.message;
      }
    }
    this.groupErrors.set(groups);
  }

  private notify(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
