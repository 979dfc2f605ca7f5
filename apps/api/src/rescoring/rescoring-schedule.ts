/**
 * The re-scoring's timetable: a node-cron expression and an IANA time zone, stored as JSON
 * under the `rescoring_schedule` key of `app_settings` (default: 06:00 UTC on the first Monday
 * of January, April, July and October). Also the calendar quarter of a moment in a zone, and the
 * next time an expression fires after a given moment.
 */
import cron from 'node-cron';
import { eq } from 'drizzle-orm';
import { appSettings, type KeelsonDatabase } from '@keelson/db';
import {
  rescoringScheduleSchema,
  type RescoringScheduleDto,
  type RescoringScheduleInput,
} from '@keelson/contracts';
import { invalidRequest } from '../http/app-error';

const KEY = 'rescoring_schedule';

/** 06:00 on the first Monday (`1#1`) of each quarter's first month, in UTC. */
export const RESCORING_SCHEDULE_DEFAULT: RescoringScheduleInput = {
  cron: '0 6 * 1,4,7,10 1#1',
  timeZone: 'UTC',
  isEnabled: true,
};

/** How far {@link nextRunOf} looks ahead before it says the expression never fires. */
const LOOKAHEAD_DAYS = 5 * 366;

/** The stored timetable (the default when none is stored or it is unreadable). */
export function loadRescoringSchedule(db: KeelsonDatabase):
  RescoringScheduleInput & { updatedAt: string | null } {
  const row = db.select().from(appSettings).where(eq(appSettings.key, KEY)).get();
  if (!row) return { ...RESCORING_SCHEDULE_DEFAULT, updatedAt: null };
  try {
    const parsed = rescoringScheduleSchema.safeParse(JSON.parse(row.value));
    return parsed.success ? { ...parsed.data, updatedAt: row.updatedAt }
      : { ...RESCORING_SCHEDULE_DEFAULT, updatedAt: null };
  } catch {
    return { ...RESCORING_SCHEDULE_DEFAULT, updatedAt: null };
  }
}

/** Stores a timetable already checked with {@link checkSchedule}. */
export function saveRescoringSchedule(db: KeelsonDatabase, schedule: RescoringScheduleInput,
  now: Date): void {
  const value = JSON.stringify({ cron: schedule.cron, timeZone: schedule.timeZone,
    isEnabled: schedule.isEnabled });
  const updatedAt = now.toISOString();
  db.insert(appSettings).values({ key: KEY, value, updatedAt })
    .onConflictDoUpdate({ target: appSettings.key, set: { value, updatedAt } }).run();
}

/** The answer of GET /api/rescoring/schedule as of `now`. */
export function scheduleDto(stored: RescoringScheduleInput & { updatedAt: string | null },
  now: Date): RescoringScheduleDto {
  const next = stored.isEnabled ? nextRunOf(stored.cron, stored.timeZone, now) : null;
  return { cron: stored.cron, timeZone: stored.timeZone, isEnabled: stored.isEnabled,
    nextRunAt: next?.toISOString() ?? null, updatedAt: stored.updatedAt };
}

/**
 * Throws a 400 naming the field when node-cron refuses the expression, Intl does not know the
 * zone, or the expression never fires within five years (`0 6 31 2 *`).
 */
export function checkSchedule(schedule: RescoringScheduleInput, now: Date): void {
  const validation = cron.validateDetailed(schedule.cron);
  if (!validation.valid) {
    const reason = validation.errors.map((error) => `${error.field}: ${error.message}`)
      .join('; ') || 'not a cron expression';
    throw fieldError('body.cron', `"${schedule.cron}" is not a schedule node-cron accepts ` +
      `(${reason})`);
  }
  if (!isTimeZone(schedule.timeZone)) {
    throw fieldError('body.timeZone', `"${schedule.timeZone}" is not an IANA time zone ` +
      '(for example UTC or Europe/Berlin)');
  }
  if (nextRunOf(schedule.cron, schedule.timeZone, now) === null) {
    throw fieldError('body.cron', `"${schedule.cron}" never fires in the next five years`);
  }
}

function fieldError(path: string, message: string) {
  return invalidRequest(`The request is not valid: ${path}: ${message}`,
    { issues: [{ path, message }] });
}

/** Whether Intl knows `timeZone`. */
export function isTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone });
    return true;
  } catch {
    return false;
  }
}

/** Local calendar parts of a moment in a zone. */
interface LocalParts {
  year: number;
  month: number;
  hour: number;
  minute: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function localParts(date: Date, timeZone: string): LocalParts {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-GB', { timeZone, year: 'numeric',
      month: 'numeric', hour: 'numeric', minute: 'numeric', hourCycle: 'h23' });
    formatters.set(timeZone, formatter);
  }
  const parts = Object.fromEntries(formatter.formatToParts(date)
    .map((part) => [part.type, part.value]));
  return { year: Number(parts['year']), month: Number(parts['month']),
    hour: Number(parts['hour']) % 24, minute: Number(parts['minute']) };
}

/**
 * The first time after `from` at which `expression` fires in `timeZone`, or null within five
 * years. node-cron's own `getNextRun()` only counts from the real clock, so this walks forward
 * from `from` and asks node-cron's `match()` (its own reading of `1#1` and of day-of-month
 * with day-of-week) at each candidate minute. The walk jumps a whole local hour when the hour
 * cannot match, so a quarter costs a few thousand steps, not a hundred thousand.
 */
export function nextRunOf(expression: string, timeZone: string, from: Date): Date | null {
  const fields = cron.parse(expression);
  const hours = new Set(fields.hour);
  const minutes = new Set(fields.minute);
  const seconds = [...fields.second].sort((a, b) => a - b);
  const task = cron.createTask(expression, () => undefined, { timezone: timeZone });
  try {
    let at = Math.floor(from.getTime() / 60_000) * 60_000;
    const end = from.getTime() + LOOKAHEAD_DAYS * 86_400_000;
    while (at <= end) {
      const local = localParts(new Date(at), timeZone);
      if (!hours.has(local.hour)) {
        at += (60 - local.minute) * 60_000;
        continue;
      }
      if (minutes.has(local.minute)) {
        for (const second of seconds) {
          const candidate = new Date(at + second * 1000);
          if (candidate.getTime() > from.getTime() && task.match(candidate)) return candidate;
        }
      }
      at += 60_000;
    }
    return null;
  } finally {
    void task.destroy();
  }
}
