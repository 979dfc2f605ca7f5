/**
 * The four notification e-mails (a plan to approve, a decision on a plan, a task assigned, the
 * weekly digest of overdue tasks), built on {@link layoutMail}. Pure: data in, message out.
 */
import {
  PLAN_STATUS_LABELS,
  PLAN_STRATEGY_LABELS,
  TASK_STATUS_LABELS,
  type PlanStatus,
} from '@keelson/contracts';
import type { OutgoingMail } from '../mail/mailer';
import { layoutMail, type MailBlock } from './mail-layout';
import type {
  MailRecipient,
  OverdueTaskRow,
  PlanMailContext,
  TaskMailContext,
} from './notifications.repository';

const DECISION_SUPPORT =
  'The numbers are decision support; your company\'s own procedures decide.';

/** Links into the app, from its base URL. */
export const appLinks = {
  approvals: (publicUrl: string) => `${publicUrl}/approvals`,
  plan: (publicUrl: string, planId: number) => `${publicUrl}/plans/${planId}`,
  tasks: (publicUrl: string) => `${publicUrl}/tasks`,
};

/** `plan 3 for "<entry title>" (supplier S-1)`: how every message names a plan. */
function planName(plan: PlanMailContext): string {
  return `plan ${plan.id} for "${plan.entry.title}" (supplier ${plan.entry.supplierCode})`;
}

function planFacts(plan: PlanMailContext): [string, string][] {
  const rows: [string, string][] = [
    ['Register entry', `${plan.entry.title} (supplier ${plan.entry.supplierCode})`],
    ['Strategy', PLAN_STRATEGY_LABELS[plan.strategy] ?? plan.strategy],
    ['Description', plan.description],
  ];
  if (plan.estimatedCost !== null) {
    rows.push(['Estimated cost', plan.estimatedCost.toLocaleString('en-GB')]);
  }
  if (plan.targetDate !== null) rows.push(['Target date', plan.targetDate]);
  const whatIf = whatIfLine(plan.whatIf);
  if (whatIf) rows.push(['What-if', whatIf]);
  return rows;
}

/** The what-if in one line, when the plan carries one of the expected shape. */
export function whatIfLine(whatIf: Record<string, unknown> | null): string | null {
  const before = sideOf(whatIf?.['before']);
  const after = sideOf(whatIf?.['after']);
  if (!before || !after) return null;
  const spof = (isSpof: boolean) => (isSpof ? 'a single point of failure' : 'not a single ' +
    'point of failure');
  return `rating ${before.rating} (${before.ratingBand}) before, ${after.rating} ` +
    `(${after.ratingBand}) after; the supplier is ${spof(before.singlePointOfFailure)} ` +
    `before and ${spof(after.singlePointOfFailure)} after`;
}

function sideOf(value: unknown):
  { rating: number; ratingBand: string; singlePointOfFailure: boolean } | null {
  if (typeof value !== 'object' || value === null) return null;
  const side = value as Record<string, unknown>;
  return typeof side['rating'] === 'number' && typeof side['ratingBand'] === 'string' &&
    typeof side['singlePointOfFailure'] === 'boolean'
    ? { rating: side['rating'], ratingBand: side['ratingBand'],
      singlePointOfFailure: side['singlePointOfFailure'] }
    : null;
}

function listOf(items: readonly string[]): string {
  return items.length <= 1
    ? (items[0] ?? '')
    : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** What {@link planSubmittedEmail} says. */
export interface PlanSubmittedEmailInput {
  recipient: MailRecipient;
  plan: PlanMailContext;
  /** The plants of the plan that this recipient manages. */
  plants: readonly string[];
  submittedBy: string;
  publicUrl: string;
}

/** To a plant manager: a plan touching their plants waits for their decision. */
export function planSubmittedEmail(input: PlanSubmittedEmailInput): OutgoingMail {
  const { plan, publicUrl } = input;
  const plants = listOf(input.plants);
  const blocks: MailBlock[] = [
    { kind: 'paragraph', text: `${input.submittedBy} submitted ${planName(plan)} for ` +
      `approval. It waits for your decision for ${plants}.` },
    { kind: 'facts', rows: [...planFacts(plan), ['Your plants', plants]] },
    { kind: 'paragraph', text: `Approve it or reject it with a comment on the approvals page. ` +
      DECISION_SUPPORT },
    { kind: 'link', label: 'Open your approvals', url: appLinks.approvals(publicUrl) },
    { kind: 'link', label: 'Open the plan', url: appLinks.plan(publicUrl, plan.id) },
  ];
  return layoutMail({
    to: input.recipient.email,
    name: input.recipient.name,
    subject: `Plan waiting for your approval (${input.plants.join(', ')}): ${plan.entry.title}`,
    blocks,
    reason: `you manage ${plants} and a plan touching it waits for your approval`,
    publicUrl,
  });
}

/** What {@link planDecidedEmail} says. */
export interface PlanDecidedEmailInput {
  recipient: MailRecipient;
  plan: PlanMailContext;
  plantCode: string;
  decision: 'approved' | 'rejected';
  comment: string;
  planStatus: PlanStatus;
  decidedBy: string;
  /** Why this person hears of it: they wrote the plan, own the entry, or both. */
  isAuthor: boolean;
  isEntryOwner: boolean;
  publicUrl: string;
}

function statusNote(status: PlanStatus): string {
  const label = PLAN_STATUS_LABELS[status] ?? status;
  switch (status) {
    case 'submitted':
      return `${label}: the managers of other plants have still to decide.`;
    case 'draft':
    case 'rejected':
      return `${label}: change the plan and submit it again.`;
    case 'approved':
      return `${label}: every plant approved; its tasks are on.`;
    default:
      return label;
  }
}

/** To a plan's author and its entry's owner: a plant manager decided on the plan. */
export function planDecidedEmail(input: PlanDecidedEmailInput): OutgoingMail {
  const { plan, publicUrl } = input;
  const verb = input.decision === 'approved' ? 'approved' : 'rejected';
  const blocks: MailBlock[] = [
    { kind: 'paragraph', text: `${input.decidedBy} ${verb} ${planName(plan)} for plant ` +
      `${input.plantCode}.` },
    { kind: 'facts', rows: [
      ['Decision', verb === 'approved' ? 'Approved' : 'Rejected'],
      ['Plant', input.plantCode],
      ['Comment', input.comment.trim() === '' ? '(no comment)' : input.comment],
      ['Plan status now', statusNote(input.planStatus)],
      ...planFacts(plan),
    ] },
    { kind: 'link', label: 'Open the plan', url: appLinks.plan(publicUrl, plan.id) },
  ];
  const reasons = [input.isAuthor && 'you wrote this plan',
    input.isEntryOwner && 'you own its register entry'].filter(Boolean) as string[];
  return layoutMail({
    to: input.recipient.email,
    name: input.recipient.name,
    subject: `Plan ${verb} for ${input.plantCode}: ${plan.entry.title}`,
    blocks,
    reason: listOf(reasons),
    publicUrl,
  });
}

/** What {@link taskAssignedEmail} says. */
export interface TaskAssignedEmailInput {
  recipient: MailRecipient;
  task: TaskMailContext;
  /** Who assigned it; null when Keelson did (the plan's approval turned the task on). */
  assignedBy: string | null;
  publicUrl: string;
}

/** To the new owner of a task. */
export function taskAssignedEmail(input: TaskAssignedEmailInput): OutgoingMail {
  const { task, publicUrl } = input;
  const plan = task.plan;
  const who = input.assignedBy ?? 'Keelson';
  const blocks: MailBlock[] = [
    { kind: 'paragraph', text: `${who} assigned you a task of ${planName(plan)}.` },
    { kind: 'facts', rows: [
      ['Task', task.title],
      ['Due date', task.dueDate ?? 'no due date'],
      ['Status', TASK_STATUS_LABELS[task.status] ?? task.status],
      ['Plan', `${plan.id}: ${PLAN_STRATEGY_LABELS[plan.strategy] ?? plan.strategy} ` +
        `(${PLAN_STATUS_LABELS[plan.status] ?? plan.status})`],
      ['Register entry', `${plan.entry.title} (supplier ${plan.entry.supplierCode})`],
    ] },
    { kind: 'link', label: 'Open my tasks', url: appLinks.tasks(publicUrl) },
    { kind: 'link', label: 'Open the plan', url: appLinks.plan(publicUrl, plan.id) },
  ];
  return layoutMail({
    to: input.recipient.email,
    name: input.recipient.name,
    subject: `Task assigned to you: ${task.title}`,
    blocks,
    reason: 'a task of a mitigation plan was assigned to you',
    publicUrl,
  });
}

/** What {@link digestEmail} says. */
export interface DigestEmailInput {
  recipient: MailRecipient;
  /** The recipient's own overdue tasks. */
  own: readonly OverdueTaskRow[];
  /** Every overdue task (risk managers), or null. */
  all: readonly OverdueTaskRow[] | null;
  /** YYYY-MM-DD (UTC): tasks due before this day are overdue. */
  today: string;
  publicUrl: string;
}

/** Whole days from `dueDate` to `today`, both YYYY-MM-DD. */
export function daysOverdue(dueDate: string, today: string): number {
  return Math.round((Date.parse(`${today}T00:00:00Z`) - Date.parse(`${dueDate}T00:00:00Z`)) /
    86_400_000);
}

function taskLine(task: OverdueTaskRow, today: string, withOwner: boolean): string {
  const days = daysOverdue(task.dueDate, today);
  const owner = !withOwner ? '' : task.owner === null ? '; no owner'
    : `; owner ${task.owner.name}${task.owner.isActive ? '' : ' (deactivated)'}`;
  return `${task.title}: due ${task.dueDate}, ${days} day${days === 1 ? '' : 's'} overdue` +
    `${owner}; plan ${task.planId} for "${task.entryTitle}" (supplier ${task.supplierCode})`;
}

/** The weekly digest: the recipient's overdue tasks and, for risk managers, all of them. */
export function digestEmail(input: DigestEmailInput): OutgoingMail {
  const { own, all, today, publicUrl } = input;
  const blocks: MailBlock[] = [
    { kind: 'paragraph', text: `These tasks of approved or in-progress mitigation plans were ` +
      `due before ${today} (UTC) and are not done yet.` },
  ];
  if (own.length > 0) {
    blocks.push({ kind: 'list', heading: `Your overdue tasks (${own.length})`,
      items: own.map((task) => taskLine(task, today, false)) });
  }
  if (all !== null) {
    blocks.push({ kind: 'list', heading: `All overdue tasks (${all.length}), as you are a ` +
      'risk manager', items: all.map((task) => taskLine(task, today, true)) });
  }
  blocks.push({ kind: 'paragraph', text: 'Mark a task done on the tasks page, or agree a new ' +
    'due date with the plan\'s author.' });
  blocks.push({ kind: 'link', label: 'Open my tasks', url: appLinks.tasks(publicUrl) });
  const parts = [own.length > 0 && `${own.length} assigned to you`,
    all !== null && `${all.length} in all`].filter(Boolean) as string[];
  const reasons = [own.length > 0 && 'you have overdue tasks',
    all !== null && 'you are a risk manager'].filter(Boolean) as string[];
  return layoutMail({
    to: input.recipient.email,
    name: input.recipient.name,
    subject: `Overdue tasks: ${parts.join(', ')}`,
    blocks,
    reason: listOf(reasons),
    publicUrl,
  });
}
