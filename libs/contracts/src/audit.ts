/**
 * The audit trail as the API shows it: every change that matters, with who, when, what, and
 * the before and after. Read-only: no route changes or deletes a record.
 */
import { z } from 'zod';

/** One record of the trail. */
export interface AuditEventDto {
  id: number;
  /** `<subject>.<verb>`: `import.committed`, `plan.submitted`, `user.role_changed` ... */
  action: string;
  subjectType: string;
  subjectId: string;
  user: { id: number; name: string } | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  createdAt: string;
}

/** GET /api/audit query (admins: the whole trail, filtered). */
export const listAuditQuerySchema = z.object({
  action: z.string().trim().max(80).optional(),
  subjectType: z.string().trim().max(40).optional(),
  subjectId: z.string().trim().max(60).optional(),
  userId: z.coerce.number().int().positive().optional(),
  /** Inclusive, YYYY-MM-DD (UTC). */
  from: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD').optional(),
  /** Inclusive, YYYY-MM-DD (UTC). */
  to: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD').optional(),
  q: z.string().trim().max(120).optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(50),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
});
/** GET /api/audit query. */
export type ListAuditQuery = z.infer<typeof listAuditQuerySchema>;

/** GET /api/audit/export.xlsx query: the list's filters, every match. */
export const exportAuditQuerySchema = listAuditQuerySchema.omit({ limit: true, offset: true });
/** GET /api/audit/export.xlsx query. */
export type ExportAuditQuery = z.infer<typeof exportAuditQuerySchema>;

/** GET /api/audit answer, newest first. */
export interface AuditListDto {
  items: AuditEventDto[];
  total: number;
}

/** GET /api/audit/history/:subjectType/:subjectId answer: one subject's records, newest first. */
export interface AuditHistoryDto {
  items: AuditEventDto[];
}
