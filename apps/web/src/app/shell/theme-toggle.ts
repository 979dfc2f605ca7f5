import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatTooltip } from '@angular/material/tooltip';
import { type ThemeChoice, ThemePreference } from './theme-preference';

interface ThemeOption {
  readonly choice: ThemeChoice;
  readonly label: string;
  readonly icon: string;
}

const OPTIONS: readonly ThemeOption[] = [
  { choice: 'light', label: 'Light', icon: 'light_mode' },
  { choice: 'dark', label: 'Dark', icon: 'dark_mode' },
  { choice: 'system', label: 'Same as system', icon: 'brightness_auto' },
];

/** The toolbar button that switches between light, dark and the system's scheme. */
@Component({
  selector: 'kl-theme-toggle',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIcon, MatIconButton, MatMenu, MatMenuItem, MatMenuTrigger, MatTooltip],
  template: `
    <button
      matIconButton
      type="button"
      [matMenuTriggerFor]="menu"
      [matTooltip]="label()"
      [attr.aria-label]="label()"
    >
      <mat-icon>{{ current().icon }}</mat-icon>
    </button>
    <mat-menu #menu="matMenu">
      @for (option of options; track option.choice) {
        <button
          mat-menu-item
          type="button"
          role="menuitemradio"
          [attr.aria-checked]="option.choice === preference.choice()"
          (click)="preference.choose(option.choice)"
        >
          <mat-icon>{{ option.icon }}</mat-icon>
          <span>{{ option.label }}</span>
        </button>
      }
    </mat-menu>
  `,
})
export class ThemeToggle {
  protected readonly preference = inject(ThemePreference);
  protected readonly options = OPTIONS;
  protected readonly current = computed(
    () => OPTIONS.find((option) => option.choice === this.preference.choice()) ?? OPTIONS[2]!,
  );
  protected readonly label = computed(() => `Colour scheme: ${this.current().label}`);
}
