import { DOCUMENT } from '@angular/common';
import { Injectable, effect, inject, signal } from '@angular/core';

/** The colour schemes a person can choose; `system` follows the operating system. */
export const THEME_CHOICES = ['light', 'dark', 'system'] as const;
/** One of {@link THEME_CHOICES}. */
export type ThemeChoice = (typeof THEME_CHOICES)[number];

/** The localStorage key that remembers the choice in this browser. */
export const THEME_STORAGE_KEY = 'keelson.theme';

/** True when `value` is one of the theme choices. */
export function isThemeChoice(value: unknown): value is ThemeChoice {
  return typeof value === 'string' && (THEME_CHOICES as readonly string[]).includes(value);
}

/** The CSS `color-scheme` value for a choice (the theme resolves colours with light-dark()). */
export function colorSchemeFor(choice: ThemeChoice): string {
  return choice === 'system' ? 'light dark' : choice;
}

/**
 * The person's light / dark / system choice: read from localStorage at start, applied as
 * `color-scheme` on <html>, and written back whenever it changes.
 */
@Injectable({ providedIn: 'root' })
export class ThemePreference {
  private readonly document = inject(DOCUMENT);
  private readonly storage = this.document.defaultView?.localStorage ?? null;
  private readonly current = signal<ThemeChoice>(this.readStored());

  /** The current choice. */
  readonly choice = this.current.asReadonly();

  constructor() {
    effect(() => {
      const choice = this.current();
      this.document.documentElement.style.colorScheme = colorSchemeFor(choice);
      this.store(choice);
    });
  }

  /** Switches to a choice and remembers it. */
  choose(choice: ThemeChoice): void {
    this.current.set(choice);
  }

  private readStored(): ThemeChoice {
    try {
      const stored = this.storage?.getItem(THEME_STORAGE_KEY);
      return isThemeChoice(stored) ? stored : 'system';
    } catch {
      // Storage can be switched off (private windows, policies); fall back to the system.
      return 'system';
    }
  }

  private store(choice: ThemeChoice): void {
    try {
      this.storage?.setItem(THEME_STORAGE_KEY, choice);
    } catch {
      // Not remembering is acceptable; the choice still applies to this tab.
    }
  }
}
