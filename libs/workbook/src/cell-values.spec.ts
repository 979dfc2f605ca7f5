/**
 * Cell readers against the rules of spec 8.3 (numbers), 8.5 (yes/no) and 8.6 (codes). Expected
 * values are worked out by hand from those rules.
 */
import { describe, expect, it } from 'vitest';
import { readCode, readNumber, readText, readYesNo } from './cell-values';

describe('readNumber (spec 8.3)', () => {
  it.each([
    ['1,200', 1200],
    ['12,345.5', 12345.5],
    ['1,234,567', 1234567],
    [' 3 ', 3],
    ['\u00a042\u00a0', 42],
    ['-7', -7],
    ['+7.25', 7.25],
    ['1e3', 1000],
    ['2.5E-2', 0.025],
    ['-1,200.75e1', -12007.5],
    ['.5', 0.5],
    ['0012', 12],
    ['-0', 0],
  ])('reads the text %j as %d', (text, expected) => {
    expect(readNumber(text)).toEqual({ value: expected });
  });

  it.each([
    ['12,00', '","'],
    ['1,2000', '","'],
    ['0,5', '","'],
    ['1.200,50', ''],
    ['$100', 'currency'],
    ['€100', 'currency'],
    ['100%', '%'],
    ['1 200', 'spaces'],
    ['NaN', 'finite'],
    ['Infinity', 'finite'],
    ['-inf', 'finite'],
    ['1e400', 'too large'],
    ['abc', ''],
    ['1,200.5.3', ''],
    ['--1', ''],
    ['1e', ''],
  ])('refuses the text %j (hint %j)', (text, hint) => {
    const reading = readNumber(text);
    expect(reading).toHaveProperty('error');
    expect('error' in reading && reading.error).toContain(hint);
  });

  it('uses a numeric cell as it is', () => {
    expect(readNumber(12.125)).toEqual({ value: 12.125 });
    expect(readNumber(-3)).toEqual({ value: -3 });
  });

  it.each([
    ['a boolean cell', true],
    ['a date cell', new Date(Date.UTC(2024, 4, 1))],
    ['NaN', Number.NaN],
    ['infinity', Number.POSITIVE_INFINITY],
    ['a formula error', { fault: '#DIV/0!' }],
  ])('refuses %s', (_label, value) => {
    expect(readNumber(value)).toHaveProperty('error');
  });

  it.each([[null], [''], ['   ']])('reads a blank cell (%j) as null', (value) => {
    expect(readNumber(value)).toEqual({ value: null });
  });
});

describe('readYesNo (spec 8.5)', () => {
  it.each([
    ['yes', true], ['YES', true], ['Y', true], ['true', true], ['True', true], ['1', true],
    ['no', false], ['No', false], ['n', false], ['FALSE', false], ['0', false], [' y ', true],
    [true, true], [false, false], [1, true], [0, false],
  ])('reads %j as %s', (value, expected) => {
    expect(readYesNo(value)).toEqual({ value: expected });
  });

  it.each([['maybe'], ['ja'], [2], ['yes please']])('refuses %j', (value) => {
    expect(readYesNo(value)).toHaveProperty('error');
  });

  it('reads blank as null', () => {
    expect(readYesNo(null)).toEqual({ value: null });
  });
});

describe('readCode (spec 8.6)', () => {
  it.each([
    [1001, '1001'],
    [1001.0, '1001'],
    [12.5, '12.5'],
    [-0, '0'],
    [2 ** 60, '1152921504606846976'],
    ['  S-001 ', 'S-001'],
    ['s-001', 's-001'],
  ])('reads %j as %j', (value, expected) => {
    expect(readCode(value)).toEqual({ value: expected });
  });

  it('refuses booleans, dates and formula errors', () => {
    expect(readCode(true)).toHaveProperty('error');
    expect(readCode(new Date())).toHaveProperty('error');
    expect(readCode({ fault: '#REF!' })).toEqual({ error: 'the cell holds the error value #REF!' });
  });
});

describe('readText', () => {
  it('trims text and writes numbers out without exponents', () => {
    expect(readText('  Müller  ')).toEqual({ value: 'Müller' });
    expect(readText(7)).toEqual({ value: '7' });
    expect(readText(null)).toEqual({ value: null });
  });
});
