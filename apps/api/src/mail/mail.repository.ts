import { count, desc, eq } from 'drizzle-orm';
import {
  mailMessages,
  type KeelsonDatabase,
  type MailMessageRow,
  type NewMailMessageRow,
} from '@keelson/db';

/** Drizzle access to `mail_messages`. */
export class MailRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Stores a received message. */
  insert(row: NewMailMessageRow): MailMessageRow {
    return this.db.insert(mailMessages).values(row).returning().get();
  }

  /** Newest first, a page at a time, with the total. */
  list(limit: number, offset: number): { rows: MailMessageRow[]; total: number } {
    const rows = this.db
      .select()
      .from(mailMessages)
      .orderBy(desc(mailMessages.receivedAt), desc(mailMessages.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ value: count() }).from(mailMessages).get()?.value ?? 0;
    return { rows, total };
  }

  /** One message, if it exists. */
  findById(id: number): MailMessageRow | undefined {
    return this.db.select().from(mailMessages).where(eq(mailMessages.id, id)).get();
  }
}
