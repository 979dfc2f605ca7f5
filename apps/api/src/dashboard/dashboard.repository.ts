/**
 * The home dashboard's queries: counts and latest rows read straight from the register, plans,
 * tasks, runs, re-scorings and imports. Read-only; every figure is one small query.
 */
import { and, count, desc, eq, exists, inArray, isNotNull, ne, notExists, or, sql }
  from 'drizzle-orm';
import type { RatingBand, RescoringStatus, RescoringSummaryDto } from '@keelson/contracts';
import {
  analysisRuns,
  importBatches,
  mitigationPlans,
  networkVersions,
  planDecisions,
  planTasks,
  registerEntries,
  registerEntryPlants,
  rescoringRuns,
  type KeelsonDatabase,
} from '@keelson/db';
import { unsentMailCounts, type MailOutboxCounts } from '../mail/mail-outbox';
import { overdueTaskCondition } from '../plans/overdue-tasks';

/** The register statuses the dashboard counts as live risks. */
export const LIVE_STATUSES = ['open', 'mitigating'] as const;
/** One of {@link LIVE_STATUSES}. */
export type LiveStatus = (typeof LIVE_STATUSES)[number];

/** Entries per status and band, as counted. */
export interface BandCountRow {
  status: LiveStatus;
  ratingBand: RatingBand;
  entries: number;
}

/** One of a plant manager's top risks. */
export interface TopRiskRow {
  id: number;
  title: string;
  supplierCode: string;
  rating: number;
  ratingBand: RatingBand;
}

/** The latest re-scoring as stored. */
export interface RescoringRow {
  id: number;
  quarterLabel: string;
  status: RescoringStatus;
  finishedAt: string | null;
  summary: RescoringSummaryDto | null;
}

/** Options of the overdue-task count. */
export interface OverdueFilter {
  /** `YYYY-MM-DD`: tasks due strictly before it are overdue. */
  today: string;
  /** Only tasks owned by this user; all when omitted. */
  ownerId?: number;
}

/** Read-only queries behind `GET /api/dashboard`. */
export class DashboardRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Whether any network version exists. */
  hasNetwork(): boolean {
    return this.db.select({ id: networkVersions.id }).from(networkVersions).limit(1)
      .get() !== undefined;
  }

  /** Live entries per status and band; `plants` limits to entries with one of them. */
  bandCounts(plants: readonly string[] | null): BandCountRow[] {
    const e = registerEntries;
    return this.db.select({ status: e.status, ratingBand: e.ratingBand, entries: count() })
      .from(e)
      .where(and(inArray(e.status, [...LIVE_STATUSES]), this.inPlants(plants)))
      .groupBy(e.status, e.ratingBand)
      .all() as BandCountRow[];
  }

  /** The highest-rated live entries with one of `plants`, worst first (ties: lowest id). */
  topRisks(plants: readonly string[], limit: number): TopRiskRow[] {
    const e = registerEntries;
    return this.db.select({ id: e.id, title: e.title, supplierCode: e.supplierCode,
      rating: e.rating, ratingBand: e.ratingBand })
      .from(e)
      .where(and(inArray(e.status, [...LIVE_STATUSES]), this.inPlants(plants)))
      .orderBy(desc(e.rating), e.id)
      .limit(limit)
      .all();
  }

  /** Plant codes of the given entries, sorted. */
  plantsOf(ids: readonly number[]): Map<number, string[]> {
    const found = new Map<number, string[]>(ids.map((id) => [id, []]));
    if (ids.length === 0) return found;
    const rows = this.db.select().from(registerEntryPlants)
      .where(inArray(registerEntryPlants.entryId, [...ids]))
      .orderBy(registerEntryPlants.plantCode).all();
    for (const row of rows) found.get(row.entryId)?.push(row.plantCode);
    return found;
  }

  /** The latest succeeded analysis run (manual or quarterly), by finish time. */
  lastRun(): { id: number; label: string; finishedAt: string | null; kind: string } | null {
    const r = analysisRuns;
    return this.db.select({ id: r.id, label: r.label, finishedAt: r.finishedAt, kind: r.kind })
      .from(r).where(eq(r.status, 'succeeded'))
      .orderBy(desc(r.finishedAt), desc(r.id)).limit(1).get() ?? null;
  }

  /** The latest re-scoring in any status (a running or interrupted one is news too). */
  lastRescoring(): RescoringRow | null {
    const r = rescoringRuns;
    const row = this.db.select({ id: r.id, quarterLabel: r.quarterLabel, status: r.status,
      finishedAt: r.finishedAt, summary: r.summary })
      .from(r).orderBy(desc(r.createdAt), desc(r.id)).limit(1).get();
    return row ? { ...row, summary: (row.summary as RescoringSummaryDto | null) ?? null } : null;
  }

  /** Every submitted plan. */
  submittedPlans(): number {
    return this.db.select({ n: count() }).from(mitigationPlans)
      .where(eq(mitigationPlans.status, 'submitted')).get()?.n ?? 0;
  }

  /**
   * Submitted plans a plant manager can decide on now: the plan's entry has one of `plants`
   * with no decision from that plant in the current submission, and the manager did not write
   * the plan (an author never approves their own plan).
   */
  plansAwaitingDecision(userId: number, plants: readonly string[]): number {
    if (plants.length === 0) return 0;
    const p = mitigationPlans;
    const undecidedPlant = this.db.select({ one: sql`1` }).from(registerEntryPlants)
      .where(and(eq(registerEntryPlants.entryId, p.entryId),
        inArray(registerEntryPlants.plantCode, [...plants]),
        notExists(this.db.select({ one: sql`1` }).from(planDecisions)
          .where(and(eq(planDecisions.planId, p.id),
            eq(planDecisions.submittedAt, p.submittedAt),
            eq(planDecisions.plantCode, registerEntryPlants.plantCode))))));
    return this.db.select({ n: count() }).from(p)
      .where(and(eq(p.status, 'submitted'), isNotNull(p.submittedAt),
        or(sql`${p.authorId} is null`, ne(p.authorId, userId)), exists(undecidedPlant)))
      .get()?.n ?? 0;
  }

  /** Overdue tasks: to do or doing, due before `today`, on an approved or in-progress plan. */
  overdueTasks(filter: OverdueFilter): number {
    const t = planTasks;
    return this.db.select({ n: count() }).from(t)
      .innerJoin(mitigationPlans, eq(mitigationPlans.id, t.planId))
      .where(and(overdueTaskCondition(filter.today),
        filter.ownerId === undefined ? undefined : eq(t.ownerId, filter.ownerId)))
      .get()?.n ?? 0;
  }

  /** The latest import batch in any status, with its problem counts. */
  lastImport(): { id: number; fileName: string; status: string; warningCount: number;
    errorCount: number; createdAt: string } | null {
    const b = importBatches;
    return this.db.select({ id: b.id, fileName: b.fileName, status: b.status,
      warningCount: b.warningCount, errorCount: b.errorCount, createdAt: b.createdAt })
      .from(b).orderBy(desc(b.createdAt), desc(b.id)).limit(1).get() ?? null;
  }

  /** Notification e-mails not sent yet, waiting and given up. */
  unsentMail(): MailOutboxCounts {
    return unsentMailCounts(this.db);
  }

  /** The entry has one of `plants` (no condition for null). */
  private inPlants(plants: readonly string[] | null) {
    if (plants === null) return undefined;
    if (plants.length === 0) return sql`0`;
    return exists(this.db.select({ one: sql`1` }).from(registerEntryPlants)
      .where(and(eq(registerEntryPlants.entryId, registerEntries.id),
        inArray(registerEntryPlants.plantCode, [...plants]))));
  }
}
