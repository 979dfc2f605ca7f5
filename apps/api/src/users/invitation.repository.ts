import { and, eq, isNull } from 'drizzle-orm';
import { invitations, type InvitationRow, type KeelsonDatabase } from '@keelson/db';

/** Drizzle access to `invitations`. */
export class InvitationRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Stores a new invitation (only the token's hash). */
  create(row: {
    userId: number;
    tokenHash: string;
    createdAt: string;
    expiresAt: string;
  }): InvitationRow {
    return this.db.insert(invitations).values(row).returning().get();
  }

  /** The invitation whose token hashes to `tokenHash`, if any. */
  findByTokenHash(tokenHash: string): InvitationRow | undefined {
    return this.db.select().from(invitations).where(eq(invitations.tokenHash, tokenHash)).get();
  }

  /**
   * Marks the invitation used, only if it was still unused; returns false when another request
   * used it first (so a token works once even under concurrent requests).
   */
  markUsed(id: number, usedAt: string): boolean {
    const result = this.db
      .update(invitations)
      .set({ usedAt })
      .where(and(eq(invitations.id, id), isNull(invitations.usedAt)))
      .run();
    return result.changes === 1;
  }

  /** Closes every open invitation of the user (before a new one is sent). */
  closeOpenFor(userId: number, usedAt: string): void {
    this.db
      .update(invitations)
      .set({ usedAt })
      .where(and(eq(invitations.userId, userId), isNull(invitations.usedAt)))
      .run();
  }
}
