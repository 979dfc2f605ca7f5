/**
 * Reading one cell as a number (spec 8.3), a yes/no (8.5), a code (8.6) or free text. A blank
 * cell reads as `null` and the caller applies the column's default; anything unreadable gives a
 * message that says what was expected and what was found.
 */
import { displayText, integerText, isBlank, isFault, type RawValue } from './raw-sheet';

/** A read value (null for blank) or the reason the cell cannot be read. */
export type CellReading<T> = { value: T | null } | { error: string };

// Optional sign; digits, either plain or grouped in threes by commas (the first group 1-999);
// an optional fraction after "."; an optional exponent.
const NUMBER_TEXT =
  /^[+-]?(?:(?:[1-9]\d{0,2}(?:,\d{3})+|\d+)(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/u;

/** A number cell: numeric cells as they are, text parsed by the rules of spec 8.3. */
export function readNumber(value: RawValue): CellReading<number> {
  if (isBlank(value)) {
    return { value: null };
  }
  if (typeof value === 'number') {
    return Number.isFinite(value) ? { value } : { error: `a number must be finite; got ${value}` };
  }
  if (typeof value === 'boolean') {
    return { error: `expected a number; got the yes/no value ${value ? 'TRUE' : 'FALSE'}` };
  }
  if (value instanceof Date) {
    return { error: 'expected a number; got a date (format the cell as a number)' };
  }
  if (isFault(value)) {
    return { error: faultMessage(value.fault) };
  }
  const text = (value as string).trim();
  if (!NUMBER_TEXT.test(text)) {
    return { error: `expected a number; got "${text}"${numberHint(text)}` };
  }
  const parsed = Number(text.replaceAll(',', ''));
  if (!Number.isFinite(parsed)) {
    return { error: `"${text}" is too large to be a number` };
  }
  return { value: Object.is(parsed, -0) ? 0 : parsed };
}

const YES = new Set(['yes', 'y', 'true', '1']);
const NO = new Set(['no', 'n', 'false', '0']);

/** A yes/no cell: yes/no/y/n/true/false/1/0 in any case, boolean cells, and numeric 1 or 0. */
export function readYesNo(value: RawValue): CellReading<boolean> {
  if (isBlank(value)) {
    return { value: null };
  }
  if (typeof value === 'boolean') {
    return { value };
  }
  if (isFault(value)) {
    return { error: faultMessage(value.fault) };
  }
  if (typeof value === 'number' && (value === 0 || value === 1)) {
    return { value: value === 1 };
  }
  if (typeof value === 'string') {
    const word = value.trim().toLowerCase();
    if (YES.has(word)) {
      return { value: true };
    }
    if (NO.has(word)) {
      return { value: false };
    }
  }
  return { error: `expected yes or no; got "${displayText(value)}"` };
}

/** A code cell: text trimmed; an integer-valued number as its digits (1001.0 -> "1001"). */
export function readCode(value: RawValue): CellReading<string> {
  if (isBlank(value)) {
    return { value: null };
  }
  if (typeof value === 'string') {
    return { value: value.trim() };
  }
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      return { error: `a code cannot be ${value}` };
    }
    return { value: Number.isInteger(value) ? integerText(value) : String(value) };
  }
  if (isFault(value)) {
    return { error: faultMessage(value.fault) };
  }
  if (value instanceof Date) {
    return { error: 'expected a code; got a date (format the cell as text)' };
  }
  return { error: `expected a code; got the yes/no value ${value ? 'TRUE' : 'FALSE'}` };
}

/** A free-text cell, trimmed; numbers, dates and yes/no values are written out as text. */
export function readText(value: RawValue): CellReading<string> {
  if (isFault(value)) {
    return { error: faultMessage(value.fault) };
  }
  return isBlank(value) ? { value: null } : { value: displayText(value) };
}

/** The message for a cell holding a fault (a formula error value or a missing result). */
export function faultMessage(fault: string): string {
  return fault.startsWith('#')
    ? `the cell holds the error value ${fault}`
    : `the cell holds a ${fault}`;
}

function numberHint(text: string): string {
  if (/^[+-]?\d+(?:,\d+)+(?:\.\d*)?$/u.test(text) || /^[+-]?0,\d/u.test(text)) {
    return ' ("," is allowed only between groups of three digits, and "." is the decimal point)';
  }
  if (/[$€£¥%]/u.test(text)) {
    return ' (leave out currency signs and "%")';
  }
  if (/\d\s+\d/u.test(text)) {
    return ' (no spaces inside a number)';
  }
  if (/^[+-]?(?:nan|inf(?:inity)?)$/iu.test(text)) {
    return ' (not a finite number)';
  }
  return '';
}
