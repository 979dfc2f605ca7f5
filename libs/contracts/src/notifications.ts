/**
 * E-mail notifications: the kinds of message Keelson sends, and each user's choice of which to
 * receive (an unsubscribe setting per kind).
 */
import { z } from 'zod';

/** Kinds of e-mail a user can switch off. */
export const MAIL_KINDS = ['plan_submitted', 'plan_decided', 'task_assigned', 'digest',
  'rescoring'] as const;
/** One of {@link MAIL_KINDS}. */
export type MailKind = (typeof MAIL_KINDS)[number];

/** What each kind is, for the settings screen. */
export const MAIL_KIND_LABELS: Record<MailKind, string> = {
  plan_submitted: 'A plan waits for my approval',
  plan_decided: 'A decision on a plan I wrote or whose entry I own',
  task_assigned: 'A task is assigned to me',
  digest: 'Weekly digest of overdue tasks',
  rescoring: 'The quarterly re-scoring has finished (what changed, and my entries whose ' +
    'rating changed)',
};

/** GET /api/me/mail-preferences answer and PUT body: the kinds switched off. */
export const mailPreferencesSchema = z.object({
  unsubscribed: z.array(z.enum(MAIL_KINDS)).max(MAIL_KINDS.length),
});
/** GET /api/me/mail-preferences answer and PUT body. */
export type MailPreferencesDto = z.infer<typeof mailPreferencesSchema>;

/** POST /api/admin/digest answer: how many digests were sent now. */
export interface DigestSentDto {
  recipients: number;
  overdueTasks: number;
}
