import { describe, expect, it } from 'vitest';
import { quarterLabelOf } from './rescoring';

// Worked by hand from the zones' offsets (IANA tz database): Auckland is UTC+13 in December,
// Berlin UTC+2 at the end of March (summer time from the last Sunday of March).
describe('quarterLabelOf', () => {
  it('reads the quarter in the zone: New Year in Auckland is still Q4 in UTC', () => {
    const moment = new Date('2026-12-31T12:00:00.000Z');
    expect(quarterLabelOf(moment, 'Pacific/Auckland')).toBe('2027-Q1');
    expect(quarterLabelOf(moment, 'UTC')).toBe('2026-Q4');
  });

  it('turns the quarter at local midnight', () => {
    expect(quarterLabelOf(new Date('2027-03-31T21:59:59Z'), 'Europe/Berlin')).toBe('2027-Q1');
    expect(quarterLabelOf(new Date('2027-03-31T22:00:00Z'), 'Europe/Berlin')).toBe('2027-Q2');
    expect(quarterLabelOf(new Date('2027-07-01T00:00:00Z'), 'UTC')).toBe('2027-Q3');
    expect(quarterLabelOf(new Date('2027-09-30T23:59:59Z'), 'UTC')).toBe('2027-Q3');
  });

  it('refuses a zone the runtime does not know', () => {
    expect(() => quarterLabelOf(new Date(), 'Mars/Olympus')).toThrow(RangeError);
  });
});
