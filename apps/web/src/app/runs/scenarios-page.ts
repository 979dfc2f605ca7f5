import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  MatAutocomplete,
  MatAutocompleteTrigger,
  type MatAutocompleteSelectedEvent,
} from '@angular/material/autocomplete';
import { MatButton } from '@angular/material/button';
import { MatChipRemove, MatChipRow, MatChipSet } from '@angular/material/chips';
import { MatOption } from '@angular/material/core';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import type {
  FailureSet,
  NetworkSupplierDto,
  NetworkVersionDto,
  ScenarioDto,
  ScenarioResultDto,
} from '@keelson/contracts';
import { Subject, debounceTime, distinctUntilChanged, filter, of, switchMap } from 'rxjs';
import { ConfirmDialog, type ConfirmDialogData } from '../shared/confirm-dialog';
import { Session } from '../auth/session';
import { countryOptions } from '../network/filter-options';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { SEARCH_DEBOUNCE_MS } from '../network/url-table-state';
import { versionLabel } from '../network/version-label';
import { apiErrorMessage } from '../shared/api-error-message';
import { ScenarioResult } from './scenario-result';
import { ScenariosApi } from './scenarios-api';
import { VERSION_PICKER_LIMIT } from './start-run-dialog';

/**
 * Scenarios: build a failure set (suppliers found by search, whole countries and regions),
 * evaluate it on a network version, and keep it under a name to evaluate again later, on the
 * same or another version. Risk managers and admins save and delete; everyone evaluates.
 */
@Component({
  selector: 'kl-scenarios-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatAutocomplete,
    MatAutocompleteTrigger,
    MatButton,
    MatChipRemove,
    MatChipRow,
    MatChipSet,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    ScenarioResult,
  ],
  host: { class: 'kl-page' },
  templateUrl: './scenarios-page.html',
  styleUrl: './scenarios-page.scss',
})
export class ScenariosPage {
  private readonly scenariosApi = inject(ScenariosApi);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(Session);
  private readonly searches = new Subject<string>();

  protected readonly versions = signal<NetworkVersionDto[]>([]);
  protected readonly versionId = signal<number | null>(null);
  protected readonly suppliers = signal<string[]>([]);
  protected readonly countryCodes = signal<string[]>([]);
  protected readonly regions = signal<string[]>([]);
  protected readonly suggestions = signal<NetworkSupplierDto[]>([]);
  protected readonly result = signal<ScenarioResultDto | null>(null);
  protected readonly isEvaluating = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly saved = signal<ScenarioDto[]>([]);
  protected readonly name = signal('');
  /** The saved scenario the builder was loaded from, if any. */
  protected readonly loadedScenario = signal<ScenarioDto | null>(null);
  protected readonly message = signal<string | null>(null);
  protected readonly countries = countryOptions();
  protected readonly regionChoices = computed(() =>
    [...new Set(this.countries().map((country) => country.region))].sort(),
  );
  protected readonly canSave = computed(() => this.session.hasRole('risk_manager', 'admin'));
  protected readonly failureSet = computed(
    (): FailureSet => ({
      suppliers: this.suppliers(),
      countries: this.countryCodes(),
      regions: this.regions(),
    }),
  );
  protected readonly isEmpty = computed(() => {
    const set = this.failureSet();
    return set.suppliers.length + set.countries.length + set.regions.length === 0;
  });
  protected readonly versionLabel = versionLabel;

  constructor() {
    inject(NetworkVersionsApi)
      .list(VERSION_PICKER_LIMIT)
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (page) => {
          this.versions.set(page.items);
          const latest = page.items.find((version) => version.isLatest) ?? page.items[0];
          this.versionId.set(latest?.id ?? null);
        },
        error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
      });
    this.searches
      .pipe(
        debounceTime(SEARCH_DEBOUNCE_MS),
        distinctUntilChanged(),
        filter(() => this.versionId() !== null),
        switchMap((q) =>
          q.length === 0 ? of([]) : this.scenariosApi.searchSuppliers(this.versionId()!, q),
        ),
        takeUntilDestroyed(),
      )
      .subscribe({ next: (found) => this.suggestions.set(found) });
    this.loadSaved();
  }

  protected search(text: string): void {
    this.searches.next(text.trim());
  }

  protected addSupplier(event: MatAutocompleteSelectedEvent, input: HTMLInputElement): void {
    const code = String(event.option.value);
    this.suppliers.update((codes) => (codes.includes(code) ? codes : [...codes, code]));
    input.value = '';
    this.suggestions.set([]);
  }

  protected removeSupplier(code: string): void {
    this.suppliers.update((codes) => codes.filter((candidate) => candidate !== code));
  }

  protected evaluate(): void {
    const versionId = this.versionId();
    if (versionId === null || this.isEmpty()) {
      return;
    }
    this.isEvaluating.set(true);
    this.error.set(null);
    this.scenariosApi.evaluate(versionId, this.failureSet()).subscribe({
      next: (result) => {
        this.isEvaluating.set(false);
        this.result.set(result);
      },
      error: (failure: unknown) => {
        this.isEvaluating.set(false);
        this.result.set(null);
        this.error.set(apiErrorMessage(failure));
      },
    });
  }

  protected save(): void {
    const name = this.name().trim();
    if (!name || this.isEmpty()) {
      return;
    }
    const loaded = this.loadedScenario();
    const input = { ...this.failureSet(), name };
    const request =
      loaded && loaded.name === name
        ? this.scenariosApi.update(loaded.id, input)
        : this.scenariosApi.save(input);
    request.subscribe({
      next: (scenario) => {
        this.loadedScenario.set(scenario);
        this.message.set(`Saved “${scenario.name}”.`);
        this.loadSaved();
      },
      error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
    });
  }

  /** Puts a saved failure set into the builder and evaluates it on the chosen version. */
  protected rerun(scenario: ScenarioDto): void {
    this.loadedScenario.set(scenario);
    this.name.set(scenario.name);
    this.suppliers.set([...scenario.suppliers]);
    this.countryCodes.set([...scenario.countries]);
    this.regions.set([...scenario.regions]);
    this.message.set(null);
    this.evaluate();
  }

  protected remove(scenario: ScenarioDto): void {
    const data: ConfirmDialogData = {
      title: 'Delete this scenario?',
      message: `“${scenario.name}” will no longer be listed. Results shown now stay on screen.`,
      confirmLabel: 'Delete',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        filter((isConfirmed) => isConfirmed === true),
        switchMap(() => this.scenariosApi.remove(scenario.id)),
      )
      .subscribe({
        next: () => {
          if (this.loadedScenario()?.id === scenario.id) {
            this.loadedScenario.set(null);
          }
          this.loadSaved();
        },
        error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
      });
  }

  /** "3 suppliers, 1 country, 0 regions". */
  protected describe(set: FailureSet): string {
    const count = (n: number, one: string, many: string): string => `${n} ${n === 1 ? one : many}`;
    return [
      count(set.suppliers.length, 'supplier', 'suppliers'),
      count(set.countries.length, 'country', 'countries'),
      count(set.regions.length, 'region', 'regions'),
    ].join(', ');
  }

  private loadSaved(): void {
    this.scenariosApi.list().subscribe({
      next: (scenarios) => this.saved.set(scenarios),
      error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
    });
  }
}
