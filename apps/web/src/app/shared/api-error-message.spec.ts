import { HttpErrorResponse } from '@angular/common/http';
import { describe, expect, it } from 'vitest';
import {
  UNKNOWN_ERROR_MESSAGE,
  UNREACHABLE_MESSAGE,
  apiErrorCode,
  apiErrorMessage,
} from './api-error-message';

describe('apiErrorMessage', () => {
  it("gives the API's own message and code", () => {
    const error = new HttpErrorResponse({
      status: 429,
      error: { error: { code: 'rate_limited', message: 'Too many attempts; wait 15 minutes.' } },
    });
    expect(apiErrorMessage(error)).toBe('Too many attempts; wait 15 minutes.');
    expect(apiErrorCode(error)).toBe('rate_limited');
  });

  it('says the server is unreachable for status 0', () => {
    expect(apiErrorMessage(new HttpErrorResponse({ status: 0 }))).toBe(UNREACHABLE_MESSAGE);
  });

  it('falls back to a plain sentence for bodies of another shape', () => {
    const html = new HttpErrorResponse({ status: 502, error: '<html>Bad gateway</html>' });
    expect(apiErrorMessage(html)).toBe(UNKNOWN_ERROR_MESSAGE);
    expect(apiErrorCode(html)).toBeNull();
    expect(apiErrorMessage(new Error('boom'))).toBe(UNKNOWN_ERROR_MESSAGE);
    const noMessage = new HttpErrorResponse({ status: 500, error: { error: { code: 'x' } } });
    expect(apiErrorMessage(noMessage)).toBe(UNKNOWN_ERROR_MESSAGE);
  });
});
