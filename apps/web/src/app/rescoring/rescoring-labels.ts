import { quarterLabelOf, type RescoringStatus } from '@keelson/contracts';

const STATUS_WORDS: Record<RescoringStatus, string> = {
  queued: 'Waiting to start',
  running: 'Running',
  succeeded: 'Finished',
  failed: 'Failed',
  interrupted: 'Interrupted',
  cancelled: 'Cancelled',
};

/** A re-scoring's status in words, for its chip. */
export function rescoringStatusLabel(status: RescoringStatus): string {
  return STATUS_WORDS[status];
}

/** True while a re-scoring may still change (its progress is followed). */
export function isRescoringActive(status: RescoringStatus): boolean {
  return status === 'queued' || status === 'running';
}

/**
 * The quarter label of a moment in a time zone (`2026-Q4`), read as the server reads it
 * ({@link quarterLabelOf}). An unknown zone falls back to UTC: this is only a default to type over.
 */
export function quarterOf(now: Date, timeZone = 'UTC'): string {
  try {
    return quarterLabelOf(now, timeZone);
  } catch {
    return quarterLabelOf(now, 'UTC');
  }
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August',
  'September', 'October', 'November', 'December'];
const DAYS = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const ORDINALS = ['first', 'second', 'third', 'fourth', 'fifth'];

function list(words: string[]): string {
  return words.length <= 1 ? (words[0] ?? '')
    : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

function numbers(field: string, min: number, max: number): number[] | null {
  if (!/^\d+(,\d+)*$/.test(field)) return null;
  const values = field.split(',').map(Number);
  return values.every((value) => value >= min && value <= max) ? values : null;
}

/** The day part: how it reads alone (every month) and before a list of months. */
interface DayWords {
  alone: string;
  before: string;
}

function daysInWords(dayOfMonth: string, dayOfWeek: string): DayWords | null {
  const nth = /^([0-7])#([1-5])$/.exec(dayOfWeek);
  if (dayOfMonth === '*' && nth) {
    const day = `the ${ORDINALS[Number(nth[2]) - 1]} ${DAYS[Number(nth[1]) % 7]}`;
    return { alone: `on ${day} of every month`, before: `on ${day} of` };
  }
  const weekdays = numbers(dayOfWeek, 0, 7);
  if (dayOfMonth === '*' && weekdays) {
    const days = `every ${list(weekdays.map((day) => DAYS[day % 7]!))}`;
    return { alone: days, before: `${days} in` };
  }
  const days = numbers(dayOfMonth, 1, 31);
  if (dayOfWeek === '*' && days) {
    const phrase = `on day ${list(days.map(String))} of`;
    return { alone: `${phrase} every month`, before: phrase };
  }
  if (dayOfMonth === '*' && dayOfWeek === '*') {
    return { alone: 'every day', before: 'every day in' };
  }
  return null;
}

/**
 * A five-field cron expression in words where that is easy ("06:00 on the first Monday of
 * January, April, July and October"); null for anything else, and the page shows the expression.
 */
export function cronInWords(cron: string): string | null {
  const fields = cron.trim().split(/\s+/);
  if (fields.length !== 5) return null;
  const [minute, hour, dayOfMonth, month, dayOfWeek] = fields as [string, string, string,
    string, string];
  const minutes = numbers(minute, 0, 59);
  const hours = numbers(hour, 0, 23);
  if (minutes?.length !== 1 || hours?.length !== 1) return null;
  const time = `${String(hours[0]).padStart(2, '0')}:${String(minutes[0]).padStart(2, '0')}`;
  const days = daysInWords(dayOfMonth, dayOfWeek);
  if (days === null) return null;
  if (month === '*') return `${time} ${days.alone}`;
  const months = numbers(month, 1, 12);
  if (months === null) return null;
  return `${time} ${days.before} ${list(months.map((value) => MONTHS[value - 1]!))}`;
}
