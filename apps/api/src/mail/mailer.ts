import nodemailer, { type Transporter } from 'nodemailer';

/** One e-mail to send. Every Keelson e-mail has a text and an HTML part. */
export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/** Sends e-mail. The app gets one; tests read what was sent back from `mail_messages`. */
export interface Mailer {
  /** Resolves once the SMTP server accepted the message. */
  send(mail: OutgoingMail): Promise<void>;
  /** Closes the transport's connections. */
  close(): void;
}

/** Where a {@link Mailer} sends: an SMTP URL, or a host and port without authentication. */
export type SmtpTarget = { url: string } | { host: string; port: number };

/**
 * A {@link Mailer} over nodemailer's SMTP transport. For the in-process sink (a host and port)
 * TLS is skipped: the sink listens on the loopback address only.
 */
export function createSmtpMailer(target: SmtpTarget, from: string): Mailer {
  const transport: Transporter =
    'url' in target
      ? nodemailer.createTransport(target.url)
      : nodemailer.createTransport({
          host: target.host,
          port: target.port,
          secure: false,
          ignoreTLS: true,
          connectionTimeout: 5_000,
          greetingTimeout: 5_000,
          socketTimeout: 10_000,
        });
  return {
    async send(mail) {
      if (mail.to.length === 0) {
        throw new Error(`E-mail "${mail.subject}" has no recipient.`);
      }
      await transport.sendMail({ from, ...mail });
    },
    close() {
      transport.close();
    },
  };
}
