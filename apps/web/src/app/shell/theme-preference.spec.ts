import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { THEME_STORAGE_KEY, ThemePreference, colorSchemeFor } from './theme-preference';

describe('ThemePreference', () => {
  beforeEach(() => {
    localStorage.clear();
    document.documentElement.style.colorScheme = '';
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  });

  afterEach(() => localStorage.clear());

  it('follows the system when nothing was chosen', () => {
    const preference = TestBed.inject(ThemePreference);
    TestBed.tick();
    expect(preference.choice()).toBe('system');
    expect(document.documentElement.style.colorScheme).toBe('light dark');
  });

  it('applies and remembers a choice', () => {
    const preference = TestBed.inject(ThemePreference);
    preference.choose('dark');
    TestBed.tick();
    expect(document.documentElement.style.colorScheme).toBe('dark');
    expect(localStorage.getItem(THEME_STORAGE_KEY)).toBe('dark');
  });

  it('starts from the remembered choice and ignores unknown stored values', () => {
    localStorage.setItem(THEME_STORAGE_KEY, 'light');
    expect(TestBed.inject(ThemePreference).choice()).toBe('light');

    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    localStorage.setItem(THEME_STORAGE_KEY, 'sepia');
    expect(TestBed.inject(ThemePreference).choice()).toBe('system');
  });
});

describe('colorSchemeFor', () => {
  it('maps each choice to a CSS color-scheme', () => {
    expect(colorSchemeFor('light')).toBe('light');
    expect(colorSchemeFor('dark')).toBe('dark');
    expect(colorSchemeFor('system')).toBe('light dark');
  });
});
