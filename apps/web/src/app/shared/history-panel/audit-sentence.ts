/**
 * Plain words for the audit trail's records: one sentence per action ("Pia Lindqvist approved
 * for P-NORTH: 'ok'"), the fields that changed with their before and after, and "3 hours ago".
 * Shared by the history panel and the administrator's audit page.
 */
import type { AuditEventDto } from '@keelson/contracts';

/** One field that differs between an event's before and after. */
export interface ChangedField {
  /** The key in before/after (`plantCodes`). */
  key: string;
  /** The key in words (`plant codes`). */
  label: string;
  /** The value before, as text ("—" when absent or empty). */
  before: string;
  /** The value after, as text ("—" when absent or empty). */
  after: string;
}

// Keys that say where an event belongs (its plan or entry), not what changed.
const CONTEXT_KEYS = new Set(['entryId', 'planId']);

const FLAG_WORDS: Record<string, string> = {
  supplier_removed: 'its supplier is no longer in the network',
  no_longer_matters: 'no longer a single point of failure and rated low',
};

/** A re-scoring's quarter label from its record, else its number. */
function quarterOf(after: Record<string, unknown>, id: string): string {
  return typeof after['quarterLabel'] === 'string' ? `${after['quarterLabel']} (#${id})` : `#${id}`;
}

/** Who did it: the user's name, or "Keelson" for the system (a scheduled job). */
export function actorName(event: AuditEventDto): string {
  return event.user?.name ?? 'Keelson';
}

/** A readable sentence for the event, starting with who did it. */
export function describeAuditEvent(event: AuditEventDto): string {
  const who = actorName(event);
  const after = event.after ?? {};
  const before = event.before ?? {};
  const id = event.subjectId;
  const quoted = (value: unknown) =>
    typeof value === 'string' && value.trim() !== '' ? `: '${value}'` : '';
  const task = () => {
    const title = after['title'] ?? before['title'];
    return typeof title === 'string' ? `task '${title}'` : `task #${id}`;
  };
  switch (event.action) {
    case 'import.committed':
      return `${who} committed an import as network version ${id}`;
    case 'run.succeeded':
      return `Analysis run ${id} finished (started by ${who})`;
    case 'register.created':
      return `${who} added register entry #${id}`;
    case 'register.updated':
      return `${who} edited the register entry`;
    case 'register.likelihood_overridden':
      return after['likelihoodOverride'] === null || after['likelihoodOverride'] === undefined
        ? `${who} removed the likelihood override${quoted(after['reason'])}`
        : `${who} set the likelihood to ${String(after['likelihoodOverride'])}` +
          quoted(after['reason']);
    case 'register.mitigating':
      return `${who}'s approval moved the entry to mitigating`;
    case 'plan.created':
      return `${who} drafted plan #${id}`;
    case 'plan.updated':
      return `${who} edited plan #${id}`;
    case 'plan.what_if_evaluated':
      return `${who} ran the what-if of plan #${id}`;
    case 'plan.submitted':
      return `${who} submitted plan #${id} for approval`;
    case 'plan.approved':
      return `${who} approved plan #${id} for ${String(after['plantCode'] ?? 'a plant')}` +
        quoted(after['comment']);
    case 'plan.rejected':
      return `${who} rejected plan #${id} for ${String(after['plantCode'] ?? 'a plant')}` +
        quoted(after['comment']);
    case 'plan.withdrawn':
      return `${who} withdrew plan #${id}`;
    case 'plan.in_progress':
      return `Plan #${id} is in progress (${who})`;
    case 'plan.done':
      return `Plan #${id} is done: every task is finished (${who})`;
    case 'task.created':
      return `${who} added ${task()}`;
    case 'task.updated':
      return `${who} changed ${task()}`;
    case 'task.deleted':
      return `${who} deleted ${task()}`;
    case 'task.commented':
      return `${who} commented on ${task()}${quoted(after['text'] ?? after['comment'])}`;
    case 'user.invited':
      return `${who} invited ${String(after['name'] ?? after['email'] ?? `user #${id}`)}`;
    case 'user.updated':
      return `${who} edited user #${id}`;
    case 'user.role_changed':
      return `${who} changed the role or plants of user #${id}`;
    case 'user.deactivated':
      return `${who} deactivated user #${id}`;
    case 'user.reactivated':
      return `${who} reactivated user #${id}`;
    case 'user.mail_preferences_changed':
      return `${who} changed the e-mail settings of user #${id}`;
    case 'register.flag_changed':
      return after['flag'] === null || after['flag'] === undefined
        ? `${who}'s re-scoring cleared the flag of entry #${id}`
        : `${who}'s re-scoring flagged entry #${id}: ${FLAG_WORDS[String(after['flag'])]
          ?? String(after['flag'])}`;
    case 'rescoring.started':
      return `${who} started re-scoring ${quarterOf(after, id)}`;
    case 'rescoring.succeeded':
      return `Re-scoring ${quarterOf(after, id)} finished (started by ${who})`;
    case 'rescoring.cancelled':
      return `${who} cancelled re-scoring ${quarterOf(after, id)}`;
    case 'rescoring.interrupted':
      return `Re-scoring ${quarterOf(after, id)} was interrupted by a server restart`;
    case 'rescoring.resumed':
    case 'rescoring.restarted':
      return `${who} ${event.action === 'rescoring.resumed' ? 'resumed' : 'restarted'} `
        + `re-scoring ${quarterOf(after, id)}`;
    case 'rescoring.schedule_changed':
      return `${who} changed the re-scoring schedule`;
    case 'settings.scoring_changed':
      return `${who} changed the scoring settings`;
    default:
      return `${who}: ${event.action.replace(/[._]/g, ' ')} (${event.subjectType} ${id})`;
  }
}

/**
 * The fields that changed: the keys of `before` whose value differs in `after`. Keys only in
 * `after` are details of the event (a decision's plant and comment), not changes; an event
 * whose after has none of before's keys (a deletion) lists nothing. A plan's decision records
 * the new status as `planStatus`, so that stands for `status`.
 */
export function changedFields(
  before: Record<string, unknown> | null,
  after: Record<string, unknown> | null,
): ChangedField[] {
  if (!before || !after) {
    return [];
  }
  const afterOf = (key: string) =>
    key in after ? after[key] : key === 'status' ? after['planStatus'] : undefined;
  const shared = Object.keys(before).filter((key) => !CONTEXT_KEYS.has(key))
    .filter((key) => key in after || (key === 'status' && 'planStatus' in after));
  return shared
    .filter((key) => JSON.stringify(before[key]) !== JSON.stringify(afterOf(key)))
    .map((key) => ({
      key,
      label: fieldLabel(key),
      before: formatValue(before[key]),
      after: formatValue(afterOf(key)),
    }));
}

/** `plantCodes` -> `plant codes`. */
export function fieldLabel(key: string): string {
  return key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/_/g, ' ').toLowerCase();
}

/** A before/after value as short text: "—" for nothing, lists joined, objects as JSON. */
export function formatValue(value: unknown): string {
  if (value === null || value === undefined || value === '') {
    return '—';
  }
  if (Array.isArray(value)) {
    return value.length === 0 ? '—' : value.map((item) => formatValue(item)).join(', ');
  }
  if (typeof value === 'object') {
    return JSON.stringify(value);
  }
  return String(value);
}

const UNITS: [Intl.RelativeTimeFormatUnit, number][] = [
  ['year', 365 * 24 * 3600], ['month', 30 * 24 * 3600], ['week', 7 * 24 * 3600],
  ['day', 24 * 3600], ['hour', 3600], ['minute', 60],
];

/** "3 hours ago", "yesterday", "just now": `iso` relative to `now`. */
export function relativeTime(iso: string, now: Date): string {
  const seconds = Math.round((new Date(iso).getTime() - now.getTime()) / 1000);
  const format = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });
  for (const [unit, size] of UNITS) {
    if (Math.abs(seconds) >= size) {
      return format.format(Math.trunc(seconds / size), unit);
    }
  }
  return 'just now';
}
