import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import type { Logger } from 'pino';
import { SMTPServer } from 'smtp-server';
import type { MailRepository } from './mail.repository';

/** Largest message the sink accepts: 5 MB (Keelson's own e-mails are a few kB). */
export const MAIL_SINK_MAX_BYTES = 5 * 1024 * 1024;

/** A running sink. */
export interface MailSink {
  host: string;
  port: number;
  stop(): Promise<void>;
}

/** What {@link startMailSink} needs. */
export interface MailSinkOptions {
  mail: MailRepository;
  logger: Logger;
  maxBytes?: number;
  now?: () => Date;
}

/**
 * Starts the local SMTP sink used in demo and test modes: an SMTP server on 127.0.0.1 and a free
 * port, without authentication or TLS, that parses each message with mailparser and stores it in
 * `mail_messages` before answering 250, so a sender that got its answer can read the message back.
 */
export async function startMailSink(options: MailSinkOptions): Promise<MailSink> {
  const maxBytes = options.maxBytes ?? MAIL_SINK_MAX_BYTES;
  const now = options.now ?? (() => new Date());
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: maxBytes,
    banner: 'Keelson local mail sink',
    logger: false,
    closeTimeout: 1_000,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      let size = 0;
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length;
        // Past the limit keep reading (the protocol needs it) but stop buffering.
        if (size <= maxBytes) chunks.push(chunk);
      });
      stream.on('error', (error) => callback(error));
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          const error = Object.assign(new Error(`Message exceeds ${maxBytes} bytes`), {
            responseCode: 552,
          });
          callback(error);
          return;
        }
        const raw = Buffer.concat(chunks);
        simpleParser(raw, { skipHtmlToText: true })
          .then((parsed) => {
            const envelopeTo = session.envelope.rcptTo.map((rcpt) => rcpt.address.toLowerCase());
            const mailFrom = session.envelope.mailFrom;
            options.mail.insert({
              fromAddress:
                parsed.from?.text ?? (mailFrom ? mailFrom.address : '(unknown sender)'),
              toAddresses: envelopeTo.length > 0 ? envelopeTo : addressesOf(parsed.to),
              subject: parsed.subject ?? '(no subject)',
              text: parsed.text ?? null,
              html: typeof parsed.html === 'string' ? parsed.html : null,
              rawSize: raw.length,
              receivedAt: now().toISOString(),
            });
            callback(null, 'Stored');
          })
          .catch((error: unknown) => {
            options.logger.error({ err: error }, 'mail sink could not store a message');
            callback(error instanceof Error ? error : new Error(String(error)));
          });
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => options.logger.error({ err: error }, 'mail sink error'));
  const address = server.server.address() as AddressInfo;
  return {
    host: '127.0.0.1',
    port: address.port,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const objects = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return objects.flatMap((object) =>
    object.value.flatMap((entry) => (entry.address ? [entry.address.toLowerCase()] : [])),
  );
}
