import type { MailMessageDto, MailSummaryDto, Page, PageQuery } from '@keelson/contracts';
import type { MailMessageRow } from '@keelson/db';
import { notFound } from '../http/app-error';
import type { MailRepository } from './mail.repository';

function toSummary(row: MailMessageRow): MailSummaryDto {
  return {
    id: row.id,
    from: row.fromAddress,
    to: row.toAddresses,
    subject: row.subject,
    receivedAt: row.receivedAt,
  };
}

/** Reading the messages the local sink caught (administrators only, enforced by the router). */
export class MailService {
  constructor(private readonly mail: MailRepository) {}

  /** Newest first. */
  list(query: PageQuery): Page<MailSummaryDto> {
    const { rows, total } = this.mail.list(query.limit, query.offset);
    return { items: rows.map(toSummary), total };
  }

  /** One message with its text and HTML parts; 404 when unknown. */
  get(id: number): MailMessageDto {
    const row = this.mail.findById(id);
    if (!row) {
      throw notFound(`There is no e-mail with id ${id}.`);
    }
    return { ...toSummary(row), text: row.text, html: row.html };
  }
}
