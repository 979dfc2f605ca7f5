import { eq } from 'drizzle-orm';
import { afterEach, describe, expect, it } from 'vitest';
import { IN_MEMORY, auditEvents, openDatabase, type OpenDatabase } from '@keelson/db';
import { recordAudit } from './audit-trail';

let opened: OpenDatabase | undefined;
afterEach(() => opened?.close());

describe('the audit trail', () => {
  it('appends events with their before and after, and refuses to change or delete one', () => {
    opened = openDatabase(IN_MEMORY);
    const { db, sqlite } = opened;
    const id = recordAudit(db, {
      action: 'register.likelihood_overridden', subjectType: 'register_entry', subjectId: 12,
      userId: null, before: { likelihood: 3 }, after: { likelihood: 5, reason: 'flooding' },
    }, new Date('2026-12-02T09:00:00Z'));
    const row = db.select().from(auditEvents).where(eq(auditEvents.id, id)).get()!;
    expect(row).toMatchObject({ subjectId: '12', before: { likelihood: 3 },
      after: { likelihood: 5, reason: 'flooding' }, createdAt: '2026-12-02T09:00:00.000Z' });
    expect(() => sqlite.prepare('UPDATE audit_events SET action = ? WHERE id = ?')
      .run('nothing', id)).toThrow(/append-only: rows are never changed/);
    expect(() => sqlite.prepare('DELETE FROM audit_events WHERE id = ?').run(id))
      .toThrow(/append-only: rows are never deleted/);
    expect(db.select().from(auditEvents).all()).toHaveLength(1);
  });
});
