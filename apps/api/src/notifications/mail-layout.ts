/**
 * The one layout of Keelson's notification e-mails: a greeting, blocks of content, links into
 * the app and the footer that says why the person gets the message and where to change it. Each
 * message gets a plain-text part and an HTML part from the same blocks, and every value that goes
 * into the HTML is escaped here, so a builder cannot forget.
 */
import type { OutgoingMail } from '../mail/mailer';
import { escapeHtml } from '../users/invitation-email';

/** One piece of a message's content. */
export type MailBlock =
  | { kind: 'paragraph'; text: string }
  /** Label and value pairs ("Strategy: Second source"). */
  | { kind: 'facts'; rows: readonly (readonly [label: string, value: string])[] }
  /** A heading with one line per item (the digest's tasks). */
  | { kind: 'list'; heading: string; items: readonly string[] }
  | { kind: 'link'; label: string; url: string };

/** What {@link layoutMail} turns into a message. */
export interface MailLayoutInput {
  to: string;
  name: string;
  subject: string;
  blocks: readonly MailBlock[];
  /** Completes "You get this because ..." (no full stop). */
  reason: string;
  /** The app's base URL, without a trailing slash. */
  publicUrl: string;
}

const BODY_STYLE = 'font-family: sans-serif; line-height: 1.5; color: #1c2430';
const MUTED_STYLE = 'color: #5b6572; font-size: 0.9em';

/** The settings page's address, named in every footer. */
export function accountUrl(publicUrl: string): string {
  return `${publicUrl}/account`;
}

/** The footer sentence of every notification. */
export function footerText(reason: string, publicUrl: string): string {
  return `You get this because ${reason}; change which e-mails you get at ` +
    `${accountUrl(publicUrl)}`;
}

/** A subject line: one line, at most 200 characters (a title may hold anything). */
export function subjectLine(text: string): string {
  const line = text.replace(/\s+/g, ' ').trim();
  return line.length > 200 ? `${line.slice(0, 199)}…` : line;
}

/** Builds the message with both parts from `input`. */
export function layoutMail(input: MailLayoutInput): OutgoingMail {
  const footer = footerText(input.reason, input.publicUrl);
  const text = [
    `Hello ${input.name},`,
    '',
    ...input.blocks.flatMap((block) => [...textOf(block), '']),
    '--',
    footer,
  ].join('\n');
  const account = accountUrl(input.publicUrl);
  const html = [
    `<!doctype html><html><body style="${BODY_STYLE}">`,
    `<p>Hello ${escapeHtml(input.name)},</p>`,
    ...input.blocks.map(htmlOf),
    `<hr style="border: 0; border-top: 1px solid #d5dae0">`,
    `<p style="${MUTED_STYLE}">You get this because ${escapeHtml(input.reason)}; change which ` +
      `e-mails you get at <a href="${escapeHtml(account)}">${escapeHtml(account)}</a></p>`,
    '</body></html>',
  ].join('\n');
  return { to: [input.to], subject: subjectLine(input.subject), text, html };
}

function textOf(block: MailBlock): string[] {
  switch (block.kind) {
    case 'paragraph':
      return [block.text];
    case 'facts':
      return block.rows.map(([label, value]) => `${label}: ${value}`);
    case 'list':
      return [block.heading, ...block.items.map((item) => `- ${item}`)];
    case 'link':
      return [`${block.label}: ${block.url}`];
  }
}

function htmlOf(block: MailBlock): string {
  switch (block.kind) {
    case 'paragraph':
      return `<p style="white-space: pre-wrap">${escapeHtml(block.text)}</p>`;
    case 'facts':
      return [
        '<table style="border-collapse: collapse">',
        ...block.rows.map(([label, value]) =>
          `<tr><th style="text-align: left; padding: 2px 12px 2px 0; vertical-align: top">` +
          `${escapeHtml(label)}</th><td style="white-space: pre-wrap; padding: 2px 0">` +
          `${escapeHtml(value)}</td></tr>`),
        '</table>',
      ].join('\n');
    case 'list':
      return [
        `<p><strong>${escapeHtml(block.heading)}</strong></p>`,
        '<ul>',
        ...block.items.map((item) => `<li>${escapeHtml(item)}</li>`),
        '</ul>',
      ].join('\n');
    case 'link':
      return `<p><a href="${escapeHtml(block.url)}">${escapeHtml(block.label)}</a></p>`;
  }
}
