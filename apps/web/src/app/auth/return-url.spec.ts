import { describe, expect, it } from 'vitest';
import { DEFAULT_AFTER_SIGN_IN, safeReturnUrl } from './return-url';

describe('safeReturnUrl', () => {
  it('keeps in-app paths with their query string', () => {
    expect(safeReturnUrl('/admin/users?q=pia')).toBe('/admin/users?q=pia');
  });

  it.each([
    [undefined],
    [''],
    ['admin/users'],
    ['//evil.test/phish'],
    ['/\\evil.test'],
    ['https://evil.test/'],
    ['javascript:alert(1)'],
    ['/sign-in?returnUrl=%2Fhome'],
    ['/set-password?token=abc'],
    ['/home\nLocation: x'],
  ])('falls back to the home page for %j', (candidate) => {
    expect(safeReturnUrl(candidate)).toBe(DEFAULT_AFTER_SIGN_IN);
  });
});
