/**
 * The e-mails of a re-scoring, written to the outbox in the transaction that commits it: every active risk manager gets the summary
 * and the list of what changed; every owner of an entry whose rating changed gets their own
 * entries (title, supplier, old and new rating with band, flag). A risk manager who owns such
 * entries gets one message with both. Kind `rescoring` in the mail settings switches them off.
 * Built on the notifications' layout (text and HTML from the same blocks, escaped there).
 */
import type { KeelsonDatabase } from '@keelson/db';
import type { RegisterFlag, RescoringSummaryDto } from '@keelson/contracts';
import type { MailOutbox } from '../mail/mail-outbox';
import type { OutgoingMail } from '../mail/mailer';
import { layoutMail, type MailBlock } from '../notifications/mail-layout';
import {
  NotificationsRepository,
  type MailRecipient,
} from '../notifications/notifications.repository';
import { wantsMail } from '../notifications/plan-notifier';
import type { EntryChange } from './rescoring-register';

const DECISION_SUPPORT =
  'The scores are decision support; your company\'s own procedures decide what to do.';
/** Lines of changes listed in one message; the comparison page has the rest. */
const MAX_LISTED = 40;

const FLAG_WORDS: Record<RegisterFlag, string> = {
  supplier_removed: 'flagged: the supplier is no longer in the network',
  no_longer_matters: 'flagged: no longer a single point of failure and rated low',
};

/** What {@link enqueueRescoringMails} needs. */
export interface RescoringMailDeps {
  outbox: MailOutbox;
  publicUrl: () => string;
}

/** The finished re-scoring the messages describe. */
export interface FinishedRescoring {
  id: number;
  quarterLabel: string;
  analysisRunId: number;
  /** The analysis run of the re-scoring compared with, if any. */
  previousAnalysisRunId: number | null;
  summary: RescoringSummaryDto;
  changes: readonly EntryChange[];
}

/** Links into the app. */
export const rescoringLinks = {
  comparison: (publicUrl: string, fromRunId: number | null, toRunId: number) =>
    `${publicUrl}/rescoring/compare?${fromRunId === null ? '' : `from=${fromRunId}&`}` +
    `to=${toRunId}`,
  entry: (publicUrl: string, entryId: number) => `${publicUrl}/register/${entryId}`,
};

/** One change in words: `"Title" (supplier S-1): rating 12 (high) -> 6 (medium); flagged ...`. */
export function changeLine(change: EntryChange, publicUrl: string): string {
  const rating = change.previousRating === null
    ? `new entry, rated ${change.rating} (${change.ratingBand})`
    : change.previousRating === change.rating
      ? `rating ${change.rating} (${change.ratingBand}), unchanged`
      : `rating ${change.previousRating} (${change.previousRatingBand}) -> ${change.rating} ` +
        `(${change.ratingBand})`;
  const flag = change.flag ? `; ${FLAG_WORDS[change.flag]}`
    : change.previousFlag ? '; flag cleared' : '';
  return `"${change.title}" (supplier ${change.supplierCode}): ${rating}${flag} - ` +
    rescoringLinks.entry(publicUrl, change.entryId);
}

function isRatingChange(change: EntryChange): boolean {
  return change.previousRating !== null && change.previousRating !== change.rating;
}

function listed(heading: string, lines: readonly string[]): MailBlock {
  const shown = lines.slice(0, MAX_LISTED);
  const more = lines.length - shown.length;
  return { kind: 'list', heading, items: more > 0
    ? [...shown, `... and ${more} more on the comparison page`] : shown };
}

function summaryFacts(summary: RescoringSummaryDto): MailBlock {
  return { kind: 'facts', rows: [
    ['Entries re-scored', String(summary.rescored)],
    ['Ratings changed', String(summary.ratingChanged)],
    ['New entries', String(summary.created)],
    ['Supplier no longer in the network', String(summary.supplierRemoved)],
    ['No longer matters', String(summary.noLongerMatters)],
  ] };
}

/** The messages of a finished re-scoring, one per recipient. */
export function rescoringEmails(finished: FinishedRescoring, riskManagers: MailRecipient[],
  owners: MailRecipient[], publicUrl: string): OutgoingMail[] {
  const comparison = rescoringLinks.comparison(publicUrl, finished.previousAnalysisRunId,
    finished.analysisRunId);
  const allLines = finished.changes.map((change) => changeLine(change, publicUrl));
  const ownLines = (userId: number) => finished.changes
    .filter((change) => change.ownerId === userId && isRatingChange(change))
    .map((change) => changeLine(change, publicUrl));
  const { quarterLabel, summary } = finished;
  const messages: OutgoingMail[] = [];
  const managerIds = new Set(riskManagers.map((recipient) => recipient.id));
  for (const recipient of riskManagers) {
    const own = ownLines(recipient.id);
    messages.push(layoutMail({
      to: recipient.email, name: recipient.name, publicUrl,
      subject: `Quarterly re-scoring ${quarterLabel} finished: ${summary.ratingChanged} ` +
        `ratings changed, ${summary.created} new entries`,
      reason: 'you are a risk manager and the quarterly re-scoring has finished',
      blocks: [
        { kind: 'paragraph', text: `The re-scoring of ${quarterLabel} has finished and every ` +
          'register entry has its new score.' },
        summaryFacts(summary),
        ...(allLines.length > 0 ? [listed('What changed', allLines)]
          : [{ kind: 'paragraph' as const, text: 'No rating or flag changed.' }]),
        ...(own.length > 0 ? [listed('Your entries whose rating changed', own)] : []),
        { kind: 'link', label: 'Compare with the last quarter', url: comparison },
        { kind: 'paragraph', text: DECISION_SUPPORT },
      ],
    }));
  }
  for (const recipient of owners) {
    if (managerIds.has(recipient.id)) continue;
    const own = ownLines(recipient.id);
    if (own.length === 0) continue;
    messages.push(layoutMail({
      to: recipient.email, name: recipient.name, publicUrl,
      subject: `Quarterly re-scoring ${quarterLabel}: the rating of ${own.length} of your ` +
        `entries changed`,
      reason: 'you own register entries whose rating the quarterly re-scoring changed',
      blocks: [
        { kind: 'paragraph', text: `The re-scoring of ${quarterLabel} changed the rating of ` +
          'these register entries you own.' },
        listed('Your entries', own),
        { kind: 'link', label: 'Compare with the last quarter', url: comparison },
        { kind: 'paragraph', text: DECISION_SUPPORT },
      ],
    }));
  }
  return messages;
}

/**
 * Writes the messages of a finished re-scoring to the outbox in `tx`, the transaction that
 * commits the re-scoring, so they exist exactly when it does (a server stopped before they went
 * out sends them on its next start). Returns their ids for {@link MailOutbox.deliver}.
 */
export function enqueueRescoringMails(tx: KeelsonDatabase, deps: RescoringMailDeps,
  finished: FinishedRescoring): number[] {
  const repository = new NotificationsRepository(tx);
  const riskManagers = repository.recipientsWithRole('risk_manager')
    .filter((recipient) => wantsMail(recipient, 'rescoring'));
  const ownerIds = [...new Set(finished.changes.filter(isRatingChange)
    .flatMap((change) => (change.ownerId === null ? [] : [change.ownerId])))];
  const owners = repository.recipients(ownerIds)
    .filter((recipient) => wantsMail(recipient, 'rescoring'));
  const messages = rescoringEmails(finished, riskManagers, owners, deps.publicUrl());
  return deps.outbox.enqueue('rescoring', messages, tx);
}
