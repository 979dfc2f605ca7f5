/**
 * Drizzle access to `rescoring_runs` (the quarter's lock is its partial unique index), and the
 * reads the re-scoring needs of network versions, analysis runs and users. The register's own
 * writes during a re-scoring live in `rescoring-register.ts`, on the run's transaction.
 */
import { and, count, desc, eq, inArray, ne, type SQL } from 'drizzle-orm';
import {
  analysisRuns,
  networkVersions,
  rescoringRuns,
  users,
  type KeelsonDatabase,
} from '@keelson/db';
import type { RescoringStatus } from '@keelson/contracts';

/** A row of `rescoring_runs`. */
export type RescoringRow = typeof rescoringRuns.$inferSelect;

/** A re-scoring with its starter's name and its analysis run's progress. */
export interface RescoringRecord extends RescoringRow {
  startedByName: string | null;
  runProgress: number | null;
  runStage: string | null;
}

/** Changes to a re-scoring's state. */
export type RescoringChanges = Partial<Pick<RescoringRow, 'status' | 'networkVersionId' |
  'analysisRunId' | 'attempts' | 'summary' | 'error' | 'startedAt' | 'finishedAt'>>;

/** Statuses that hold a quarter's lock (the partial unique index's list). */
export const LOCKING_STATUSES: readonly RescoringStatus[] =
  ['queued', 'running', 'interrupted', 'succeeded'];

/** Reads and writes re-scorings. */
export class RescoringRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /**
   * Inserts a queued re-scoring and returns its id. Throws better-sqlite3's constraint error
   * when an unforced one takes a quarter that is locked already ({@link isQuarterLockError}).
   */
  insert(values: { quarterLabel: string; networkVersionId: number;
    trigger: RescoringRow['trigger']; isForced: boolean; startedBy: number | null;
    createdAt: string }, db: KeelsonDatabase = this.db): number {
    return db.insert(rescoringRuns).values({ ...values, status: 'queued', attempts: 1 })
      .returning({ id: rescoringRuns.id }).get().id;
  }

  /** One re-scoring. */
  find(id: number, db: KeelsonDatabase = this.db): RescoringRecord | undefined {
    return this.select(db).where(eq(rescoringRuns.id, id)).get();
  }

  /** The unforced re-scoring holding `quarterLabel`'s lock, if any. */
  lockHolder(quarterLabel: string): RescoringRecord | undefined {
    return this.select().where(and(eq(rescoringRuns.quarterLabel, quarterLabel),
      eq(rescoringRuns.isForced, false),
      inArray(rescoringRuns.status, [...LOCKING_STATUSES]))).get();
  }

  /** The re-scoring whose current attempt is analysis run `runId`, if any. */
  findByAnalysisRun(runId: number, db: KeelsonDatabase = this.db): RescoringRecord | undefined {
    return this.select(db).where(eq(rescoringRuns.analysisRunId, runId)).get();
  }

  /** The last succeeded re-scoring other than `exceptId`, newest finish first. */
  previousSucceeded(exceptId: number, db: KeelsonDatabase = this.db): number | null {
    return db.select({ id: rescoringRuns.id }).from(rescoringRuns)
      .where(and(eq(rescoringRuns.status, 'succeeded'), ne(rescoringRuns.id, exceptId)))
      .orderBy(desc(rescoringRuns.finishedAt), desc(rescoringRuns.id)).limit(1).get()?.id
      ?? null;
  }

  /** A page of re-scorings, newest first, and how many there are. */
  list(page: { limit: number; offset: number }): { rows: RescoringRecord[]; total: number } {
    const rows = this.select()
      .orderBy(desc(rescoringRuns.createdAt), desc(rescoringRuns.id))
      .limit(page.limit).offset(page.offset).all();
    const total = this.db.select({ value: count() }).from(rescoringRuns).get()?.value ?? 0;
    return { rows, total };
  }

  /** Applies `changes`; with `onlyIf`, only while the re-scoring has one of those states. */
  update(id: number, changes: RescoringChanges, onlyIf?: readonly RescoringStatus[],
    db: KeelsonDatabase = this.db): boolean {
    const condition: SQL | undefined = onlyIf
      ? and(eq(rescoringRuns.id, id), inArray(rescoringRuns.status, [...onlyIf]))
      : eq(rescoringRuns.id, id);
    return db.update(rescoringRuns).set(changes).where(condition).run().changes > 0;
  }

  /** Ids of re-scorings left `queued` or `running` (a restart lost their analysis). */
  unfinishedIds(db: KeelsonDatabase = this.db): number[] {
    return db.select({ id: rescoringRuns.id }).from(rescoringRuns)
      .where(inArray(rescoringRuns.status, ['queued', 'running'])).all().map((row) => row.id);
  }

  /** The newest network version's id, or null when nothing was imported yet. */
  latestVersionId(): number | null {
    return this.db.select({ id: networkVersions.id }).from(networkVersions)
      .orderBy(desc(networkVersions.id)).limit(1).get()?.id ?? null;
  }

  /** Whether network version `id` exists. */
  versionExists(id: number): boolean {
    return this.db.select({ id: networkVersions.id }).from(networkVersions)
      .where(eq(networkVersions.id, id)).get() !== undefined;
  }

  private select(db: KeelsonDatabase = this.db) {
    return db.select({
      id: rescoringRuns.id,
      quarterLabel: rescoringRuns.quarterLabel,
      networkVersionId: rescoringRuns.networkVersionId,
      analysisRunId: rescoringRuns.analysisRunId,
      status: rescoringRuns.status,
      trigger: rescoringRuns.trigger,
      isForced: rescoringRuns.isForced,
      attempts: rescoringRuns.attempts,
      summary: rescoringRuns.summary,
      error: rescoringRuns.error,
      startedBy: rescoringRuns.startedBy,
      createdAt: rescoringRuns.createdAt,
      startedAt: rescoringRuns.startedAt,
      finishedAt: rescoringRuns.finishedAt,
      startedByName: users.name,
      runProgress: analysisRuns.progress,
      runStage: analysisRuns.stage,
    }).from(rescoringRuns)
      .leftJoin(users, eq(users.id, rescoringRuns.startedBy))
      .leftJoin(analysisRuns, eq(analysisRuns.id, rescoringRuns.analysisRunId))
      .$dynamic();
  }
}

/** Whether `error` is the quarter's lock refusing a second unforced re-scoring. */
export function isQuarterLockError(error: unknown): boolean {
  // Drizzle wraps the driver's error in a DrizzleQueryError with the original as its cause.
  for (let current = error, depth = 0; current && depth < 3; depth++) {
    const { code, message, cause } = current as { code?: unknown; message?: unknown;
      cause?: unknown };
    if (typeof code === 'string' && code.startsWith('SQLITE_CONSTRAINT') &&
      typeof message === 'string' && message.includes('rescoring_runs.quarter_label')) {
      return true;
    }
    current = cause;
  }
  return false;
}
