import { ROLE_LABELS, type Role } from '@keelson/contracts';
import type { OutgoingMail } from '../mail/mailer';

/** What the invitation e-mail says. */
export interface InvitationEmailInput {
  to: string;
  name: string;
  role: Role;
  /** The full set-password link. */
  link: string;
  expiresAt: Date;
  /** The administrator who sent it. */
  invitedBy: string;
  isReminder: boolean;
}

/** Escapes text for HTML element content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);
}

/** The invitation e-mail, with a text and an HTML part, both carrying the link. */
export function invitationEmail(input: InvitationEmailInput): OutgoingMail {
  const role = ROLE_LABELS[input.role];
  const until = input.expiresAt.toISOString().replace('T', ' ').slice(0, 16) + ' UTC';
  const subject = input.isReminder
    ? 'Reminder: set your Keelson password'
    : 'You are invited to Keelson';
  const text = [
    `Hello ${input.name},`,
    '',
    `${input.invitedBy} invited you to Keelson, the supplier-dependency risk register, ` +
      `as ${role}.`,
    '',
    'Choose your password here to activate your account:',
    input.link,
    '',
    `The link works once and until ${until}. If you did not expect this e-mail, ignore it.`,
  ].join('\n');
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5">',
    `<p>Hello ${escapeHtml(input.name)},</p>`,
    `<p>${escapeHtml(input.invitedBy)} invited you to Keelson, the supplier-dependency risk ` +
      `register, as <strong>${escapeHtml(role)}</strong>.</p>`,
    `<p><a href="${escapeHtml(input.link)}">Choose your password</a> to activate your ` +
      'account.</p>',
    `<p>The link works once and until ${escapeHtml(until)}. If you did not expect this e-mail, ` +
      'ignore it.</p>',
    '</body></html>',
  ].join('\n');
  return { to: [input.to], subject, text, html };
}
