import { ROLES } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { ROLE_GUIDES, greetingFor } from './role-guide';

describe('ROLE_GUIDES', () => {
  it('explains every role in one sentence', () => {
    for (const role of ROLES) {
      const guide = ROLE_GUIDES[role];
      expect(guide.summary.trim().endsWith('.')).toBe(true);
      expect(guide.summary.split(/[.!?](\s|$)/).filter((part) => part.trim()).length).toBe(1);
    }
  });
});

describe('greetingFor', () => {
  it('greets by part of the day', () => {
    expect(greetingFor(0)).toBe('Good morning');
    expect(greetingFor(11)).toBe('Good morning');
    expect(greetingFor(12)).toBe('Good afternoon');
    expect(greetingFor(17)).toBe('Good afternoon');
    expect(greetingFor(18)).toBe('Good evening');
    expect(greetingFor(23)).toBe('Good evening');
  });

  it('refuses an hour outside 0-23, naming it', () => {
    expect(() => greetingFor(24)).toThrow(/got 24/);
    expect(() => greetingFor(1.5)).toThrow(RangeError);
  });
});
