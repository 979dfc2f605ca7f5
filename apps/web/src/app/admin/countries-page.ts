import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { CountryDto } from '@keelson/contracts';
import { apiErrorMessage } from '../shared/api-error-message';
import { CountriesApi } from './countries-api';

/** The hazard ratings an administrator can choose, low to high. */
export const HAZARD_LEVELS = [1, 2, 3, 4, 5] as const;

/** What each rating means, for the select's options. */
export const HAZARD_LABELS: Record<(typeof HAZARD_LEVELS)[number], string> = {
  1: '1 · low',
  2: '2',
  3: '3 · medium',
  4: '4',
  5: '5 · high',
};

/**
 * Countries (admin): the hazard rating (1-5) of every country, which feeds the likelihood of
 * the register's risks. Ratings are changed inline and saved at once; the shipped defaults are
 * marked until someone reviews them.
 */
@Component({
  selector: 'kl-countries-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButton,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatOption,
    MatPrefix,
    MatProgressBar,
    MatSelect,
    MatTableModule,
  ],
  templateUrl: './countries-page.html',
  styleUrl: './countries-page.scss',
})
export class CountriesPage {
  private readonly countriesApi = inject(CountriesApi);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['code', 'name', 'region', 'hazard', 'status', 'updated'] as const;
  protected readonly levels = HAZARD_LEVELS;
  protected readonly levelLabels = HAZARD_LABELS;
  protected readonly countries = signal<CountryDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  /** Codes whose new rating is on its way to the server. */
  protected readonly saving = signal<ReadonlySet<string>>(new Set());
  protected readonly filter = signal('');
  protected readonly visible = computed(() => {
    const text = this.filter().trim().toLowerCase();
    const countries = this.countries();
    if (!text) {
      return countries;
    }
    return countries.filter((country) =>
      [country.code, country.name, country.region].some((field) =>
        field.toLowerCase().includes(text),
      ),
    );
  });
  protected readonly defaultCount = computed(
    () => this.countries().filter((country) => country.isDefault).length,
  );

  constructor() {
    this.countriesApi.list().subscribe({
      next: (countries) => {
        this.countries.set(countries);
        this.isLoading.set(false);
      },
      error: (error: unknown) => {
        this.errorMessage.set(apiErrorMessage(error));
        this.isLoading.set(false);
      },
    });
  }

  protected onFilterInput(event: Event): void {
    this.filter.set((event.target as HTMLInputElement).value);
  }

  protected isSaving(country: CountryDto): boolean {
    return this.saving().has(country.code);
  }

  /** Keeps a shipped default as reviewed: saves the same rating, which clears the mark. */
  protected confirmDefault(country: CountryDto): void {
    this.save(country, country.hazard);
  }

  /** Saves a new hazard rating chosen in the row's select. */
  protected setHazard(country: CountryDto, hazard: number): void {
    if (hazard !== country.hazard) {
      this.save(country, hazard);
    }
  }

  // On failure the row is replaced by a copy, so its select shows the stored rating again.
  private save(country: CountryDto, hazard: number): void {
    this.markSaving(country.code, true);
    this.countriesApi.update(country.code, { hazard }).subscribe({
      next: (saved) => {
        this.markSaving(country.code, false);
        this.countries.update((countries) =>
          countries.map((candidate) => (candidate.code === saved.code ? saved : candidate)),
        );
        this.notify(`${saved.name}: hazard ${saved.hazard} saved.`);
      },
      error: (error: unknown) => {
        this.markSaving(country.code, false);
        this.countries.update((countries) =>
          countries.map((candidate) =>
            candidate.code === country.code ? { ...candidate } : candidate,
          ),
        );
        this.notify(`${country.name} was not saved: ${apiErrorMessage(error)}`);
      },
    });
  }

  private markSaving(code: string, isSaving: boolean): void {
    this.saving.update((codes) => {
      const next = new Set(codes);
      if (isSaving) {
        next.add(code);
      } else {
        next.delete(code);
      }
      return next;
    });
  }

  private notify(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 5000 });
  }
}
