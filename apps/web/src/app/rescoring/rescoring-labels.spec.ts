import { describe, expect, it } from 'vitest';
import { cronInWords, quarterOf } from './rescoring-labels';

describe('cronInWords', () => {
  it('reads the default quarterly schedule', () => {
    expect(cronInWords('0 6 * 1,4,7,10 1#1')).toBe(
      '06:00 on the first Monday of January, April, July and October');
  });

  it('reads weekly, monthly and daily expressions', () => {
    expect(cronInWords('30 7 * * 1')).toBe('07:30 every Monday');
    expect(cronInWords('0 6 1 1,7 *')).toBe('06:00 on day 1 of January and July');
    expect(cronInWords('0 6 15 * *')).toBe('06:00 on day 15 of every month');
    expect(cronInWords('5 0 * * *')).toBe('00:05 every day');
  });

  it('gives up on what does not read plainly', () => {
    expect(cronInWords('*/5 * * * *')).toBeNull();
    expect(cronInWords('0 6 * * MON')).toBeNull();
    expect(cronInWords('0 6 * *')).toBeNull();
    expect(cronInWords('0 25 * * 1')).toBeNull();
  });
});

describe('quarterOf', () => {
  it('labels the quarter in the given time zone', () => {
    // 23:30 UTC on 31 March is already 1 April in Berlin (UTC+2 in summer time).
    const moment = new Date('2027-03-31T23:30:00Z');
    expect(quarterOf(moment, 'UTC')).toBe('2027-Q1');
    expect(quarterOf(moment, 'Europe/Berlin')).toBe('2027-Q2');
    expect(quarterOf(new Date('2026-12-02T06:00:00Z'), 'UTC')).toBe('2026-Q4');
  });

  it('falls back to UTC for an unknown zone', () => {
    expect(quarterOf(new Date('2027-03-31T23:30:00Z'), 'Mars/Olympus')).toBe('2027-Q1');
  });
});
