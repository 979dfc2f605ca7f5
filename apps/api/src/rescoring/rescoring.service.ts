/**
 * The quarterly re-scoring: start (the quarter's lock first, then an analysis run of kind
 * `quarterly`), the register's re-scoring inside that run's own transaction (hooks on
 * {@link RunsService}), the outcome of a failed or cancelled run, interrupted re-scorings after
 * a restart, resume and restart, cancel, and the e-mails after the commit.
 */
import type { Logger } from 'pino';
import type { KeelsonDatabase } from '@keelson/db';
import {
  quarterLabelOf,
  type AnalysisRunDto,
  type RescoringRunDto,
  type RescoringStatus,
  type RescoringSummaryDto,
  type ResumeRescoringInput,
  type StartRescoringInput,
} from '@keelson/contracts';
import { recordAudit } from '../audit/audit-trail';
import { conflict, forbidden, notFound, type AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { MailOutbox } from '../mail/mail-outbox';
import type { RunRecord } from '../runs/runs.repository';
import { FINISHED_STATUSES, type RunsService } from '../runs/runs.service';
import { enqueueRescoringMails } from './rescoring-emails';
import {
  applyRescoring,
  snapshotEntries,
  type EntrySnapshot,
} from './rescoring-register';
import { loadRescoringSchedule } from './rescoring-schedule';
import {
  isQuarterLockError,
  RescoringRepository,
  type RescoringRecord,
} from './rescoring.repository';

/** Stored on re-scorings a restart found queued or running. */
export const INTERRUPTED_MESSAGE = 'The server stopped before this re-scoring finished, so ' +
  'nothing of it was kept. Resume it (same network version) or restart it (latest version).';

const ACTIVE: readonly RescoringStatus[] = ['queued', 'running'];
const RESUMABLE: readonly RescoringStatus[] = ['interrupted', 'failed'];

/** What started a re-scoring. */
export type RescoringTrigger = 'schedule' | 'manual';

/** Everything {@link RescoringService} is built from. */
export interface RescoringServiceDeps {
  db: KeelsonDatabase;
  now: () => Date;
  logger: Logger;
  runs: RunsService;
  outbox: MailOutbox;
  publicUrl: () => string;
}

/** Starts, follows, resumes and cancels re-scorings. */
export class RescoringService {
  private readonly repository: RescoringRepository;
  // Per analysis run: the entries before the register sync, then the ids of the e-mails the
  // re-scoring wrote to the outbox (both live only between the run's transaction and its
  // settled hook; the e-mails themselves are in the database).
  private readonly snapshots = new Map<number, Map<number, EntrySnapshot>>();
  private readonly outcomes = new Map<number, number[]>();
  private readonly mailing = new Set<Promise<void>>();

  constructor(private readonly deps: RescoringServiceDeps) {
    this.repository = new RescoringRepository(deps.db);
    deps.runs.onSucceededInTransaction((tx, run) => this.snapshot(tx, run),
      'before_register_sync');
    deps.runs.onSucceededInTransaction((tx, run, finishedAt) =>
      this.rescore(tx, run, finishedAt));
    deps.runs.onSettled((run) => this.settle(run));
  }

  /** Marks re-scorings a restart left queued or running `interrupted`; returns how many. */
  interruptUnfinished(): number {
    const now = this.deps.now();
    let count = 0;
    for (const id of this.repository.unfinishedIds()) {
      this.deps.db.transaction((tx) => {
        const before = this.repository.find(id, tx)!;
        if (!this.repository.update(id, { status: 'interrupted', error: INTERRUPTED_MESSAGE },
          ACTIVE, tx)) return;
        recordAudit(tx, { action: 'rescoring.interrupted', subjectType: 'rescoring_run',
          subjectId: id, userId: null, before: { status: before.status },
          after: { status: 'interrupted' } }, now);
        count++;
      });
    }
    return count;
  }

  /**
   * Starts a re-scoring of `input.networkVersionId` (default: the latest) for
   * `input.quarterLabel` (default: the quarter of now in the schedule's zone). The insert takes
   * the quarter's lock; a taken quarter answers 409 `quarter_taken` unless an admin forces.
   */
  start(user: SessionUser | null, input: StartRescoringInput,
    trigger: RescoringTrigger): RescoringRunDto {
    if (input.force && user?.role !== 'admin') {
      throw forbidden('Only an administrator can force another re-scoring of a quarter that ' +
        'has one already.');
    }
    const versionId = this.versionToScore(input.networkVersionId);
    const now = this.deps.now();
    const quarterLabel = input.quarterLabel ??
      quarterLabelOf(now, loadRescoringSchedule(this.deps.db).timeZone);
    const id = this.deps.db.transaction((tx) => {
      const values = { quarterLabel, networkVersionId: versionId, trigger,
        startedBy: user?.id ?? null, createdAt: now.toISOString() };
      let isForced = false;
      let inserted: number;
      try {
        inserted = this.repository.insert({ ...values, isForced: false }, tx);
      } catch (error) {
        if (!isQuarterLockError(error)) throw error;
        if (!input.force) throw this.quarterTaken(quarterLabel);
        isForced = true;
        inserted = this.repository.insert({ ...values, isForced: true }, tx);
      }
      recordAudit(tx, { action: 'rescoring.started', subjectType: 'rescoring_run',
        subjectId: inserted, userId: user?.id ?? null, after: { quarterLabel,
          networkVersionId: versionId, trigger, isForced } }, now);
      return inserted;
    });
    this.startAttempt(id, user);
    return this.get(id);
  }

  /**
   * Runs an interrupted or failed re-scoring again as a new attempt: `resume` on its network
   * version, `restart` on the latest one. 409 for any other status.
   */
  resume(user: SessionUser, id: number, input: ResumeRescoringInput): RescoringRunDto {
    const current = this.find(id);
    if (!RESUMABLE.includes(current.status)) {
      throw conflict('rescoring_not_resumable', `Re-scoring ${id} is ${current.status}; only an ` +
        'interrupted or failed re-scoring can be resumed or restarted.',
      { status: current.status });
    }
    const versionId = input.mode === 'resume' ? current.networkVersionId
      : this.versionToScore(undefined);
    const now = this.deps.now();
    try {
      this.deps.db.transaction((tx) => {
        const changes = { status: 'queued' as const, networkVersionId: versionId,
          attempts: current.attempts + 1, analysisRunId: null, summary: null, error: null,
          finishedAt: null };
        if (!this.repository.update(id, changes, RESUMABLE, tx)) {
          throw conflict('rescoring_not_resumable', `Re-scoring ${id} changed meanwhile; ` +
            'read it again.');
        }
        recordAudit(tx, { action: input.mode === 'resume' ? 'rescoring.resumed'
          : 'rescoring.restarted', subjectType: 'rescoring_run', subjectId: id,
        userId: user.id, before: { status: current.status,
          networkVersionId: current.networkVersionId, attempts: current.attempts },
        after: { status: 'queued', networkVersionId: versionId,
          attempts: current.attempts + 1 } }, now);
      });
    } catch (error) {
      // A failed re-scoring is outside the lock; another may hold its quarter now.
      if (isQuarterLockError(error)) throw this.quarterTaken(current.quarterLabel);
      throw error;
    }
    this.startAttempt(id, user);
    return this.get(id);
  }

  /** Cancels a queued or running re-scoring and its analysis run; 409 otherwise. */
  cancel(user: SessionUser, id: number): RescoringRunDto {
    const current = this.find(id);
    if (!ACTIVE.includes(current.status)) {
      throw conflict('rescoring_finished', `Re-scoring ${id} is ${current.status}; only a ` +
        'queued or running re-scoring can be cancelled.', { status: current.status });
    }
    const now = this.deps.now();
    this.deps.db.transaction((tx) => {
      this.repository.update(id, { status: 'cancelled', error: 'Cancelled before it finished.',
        finishedAt: now.toISOString() }, ACTIVE, tx);
      recordAudit(tx, { action: 'rescoring.cancelled', subjectType: 'rescoring_run',
        subjectId: id, userId: user.id, before: { status: current.status },
        after: { status: 'cancelled' } }, now);
    });
    if (current.analysisRunId !== null) {
      const run = this.deps.runs.get(current.analysisRunId);
      if (!FINISHED_STATUSES.includes(run.status)) this.deps.runs.cancel(run.id);
    }
    return this.get(id);
  }

  /** A page of re-scorings, newest first. */
  list(page: { limit: number; offset: number }): { items: RescoringRunDto[]; total: number } {
    const { rows, total } = this.repository.list(page);
    return { items: rows.map(toRescoringDto), total };
  }

  /** One re-scoring; 404 when there is none. */
  get(id: number): RescoringRunDto {
    return toRescoringDto(this.find(id));
  }

  /** Resolves when the e-mails being sent have gone out (close, specs). */
  async settled(): Promise<void> {
    while (this.mailing.size > 0) await Promise.all([...this.mailing]);
  }

  private find(id: number): RescoringRecord {
    const row = this.repository.find(id);
    if (!row) throw notFound(`There is no re-scoring ${id}.`);
    return row;
  }

  private versionToScore(requested: number | undefined): number {
    if (requested !== undefined) {
      if (!this.repository.versionExists(requested)) {
        throw notFound(`There is no network version ${requested}.`);
      }
      return requested;
    }
    const latest = this.repository.latestVersionId();
    if (latest === null) {
      throw conflict('no_network', 'There is no network version to re-score yet: import the ' +
        'network first.');
    }
    return latest;
  }

  private quarterTaken(quarterLabel: string): AppError {
    const holder = this.repository.lockHolder(quarterLabel);
    const which = holder ? ` (re-scoring ${holder.id}, ${holder.status})` : '';
    return conflict('quarter_taken', `${quarterLabel} was re-scored already${which}; an ` +
      'administrator can force another.', { rescoringId: holder?.id ?? null,
      status: holder?.status ?? null, quarterLabel });
  }

  /** Queues the analysis run of the current attempt and links it. */
  private startAttempt(id: number, user: SessionUser | null): void {
    const rescoring = this.find(id);
    let run: AnalysisRunDto;
    try {
      run = this.deps.runs.start(user, { networkVersionId: rescoring.networkVersionId,
        label: `Quarterly re-scoring ${rescoring.quarterLabel}` +
          (rescoring.attempts > 1 ? ` (attempt ${rescoring.attempts})` : ''),
        kind: 'quarterly' });
    } catch (error) {
      this.repository.update(id, { status: 'failed', finishedAt: this.deps.now().toISOString(),
        error: `The analysis run could not start: ${(error as Error).message}` }, ACTIVE);
      throw error;
    }
    // Linked before the run's job starts (it waits for the next turn of the event loop).
    this.repository.update(id, { analysisRunId: run.id }, ACTIVE);
    const unsubscribe = this.deps.runs.subscribe(run.id, (event) => {
      if (event.status === 'queued') return;
      unsubscribe();
      if (event.status === 'running') {
        this.repository.update(id, { status: 'running',
          startedAt: this.deps.now().toISOString() }, ['queued']);
      }
    });
  }

  private snapshot(tx: KeelsonDatabase, run: RunRecord): void {
    if (run.kind !== 'quarterly') return;
    const rescoring = this.repository.findByAnalysisRun(run.id, tx);
    if (!rescoring || !ACTIVE.includes(rescoring.status)) return;
    this.snapshots.set(run.id, snapshotEntries(tx));
  }

  private rescore(tx: KeelsonDatabase, run: RunRecord, finishedAt: Date): void {
    const before = this.snapshots.get(run.id);
    this.snapshots.delete(run.id);
    if (!before) return;
    const rescoring = this.repository.findByAnalysisRun(run.id, tx)!;
    const outcome = applyRescoring(tx, { rescoringId: rescoring.id, runId: run.id, before,
      userId: rescoring.startedBy, now: finishedAt });
    const summary: RescoringSummaryDto = { rescored: outcome.rescored,
      created: outcome.created, ratingChanged: outcome.ratingChanged,
      supplierRemoved: outcome.supplierRemoved, noLongerMatters: outcome.noLongerMatters,
      previousRescoringId: this.repository.previousSucceeded(rescoring.id, tx), mailsSent: 0 };
    this.repository.update(rescoring.id, { status: 'succeeded', summary: { ...summary },
      error: null, startedAt: rescoring.startedAt ?? run.startedAt,
      finishedAt: finishedAt.toISOString() }, ACTIVE, tx);
    const { mailsSent: _unsent, ...counts } = summary;
    recordAudit(tx, { action: 'rescoring.succeeded', subjectType: 'rescoring_run',
      subjectId: rescoring.id, userId: rescoring.startedBy, before: { status: rescoring.status },
      after: { status: 'succeeded', quarterLabel: rescoring.quarterLabel, analysisRunId: run.id,
        networkVersionId: run.networkVersionId, ...counts } }, finishedAt);
    const previous = summary.previousRescoringId === null ? undefined
      : this.repository.find(summary.previousRescoringId, tx);
    this.outcomes.set(run.id, enqueueRescoringMails(tx, this.deps, { id: rescoring.id,
      quarterLabel: rescoring.quarterLabel, analysisRunId: run.id,
      previousAnalysisRunId: previous?.analysisRunId ?? null, summary,
      changes: outcome.changes }));
  }

  /** After the run's transaction: its outcome for the re-scoring, then the e-mails. */
  private settle(run: AnalysisRunDto): void {
    this.snapshots.delete(run.id);
    const mailIds = this.outcomes.get(run.id);
    this.outcomes.delete(run.id);
    if (run.kind !== 'quarterly') return;
    const rescoring = this.repository.findByAnalysisRun(run.id);
    if (!rescoring) return;
    if (run.status === 'succeeded') {
      if (mailIds && rescoring.status === 'succeeded') this.track(this.mail(rescoring, mailIds));
      return;
    }
    if (!ACTIVE.includes(rescoring.status)) return;
    const status = run.status === 'cancelled' ? 'cancelled' : 'failed';
    const error = `${run.error ?? 'The analysis run did not finish.'} (analysis run ${run.id})`;
    const now = this.deps.now();
    this.deps.db.transaction((tx) => {
      if (!this.repository.update(rescoring.id, { status, error,
        finishedAt: now.toISOString() }, ACTIVE, tx)) return;
      recordAudit(tx, { action: `rescoring.${status}`, subjectType: 'rescoring_run',
        subjectId: rescoring.id, userId: null, before: { status: rescoring.status },
        after: { status, error } }, now);
    });
  }

  private track(promise: Promise<void>): void {
    this.mailing.add(promise);
    void promise.finally(() => this.mailing.delete(promise));
  }

  /** Sends the e-mails the re-scoring wrote, and counts those the server took in its summary. */
  private async mail(rescoring: RescoringRecord, mailIds: number[]): Promise<void> {
    try {
      const sent = await this.deps.outbox.deliver(mailIds);
      const summary = rescoring.summary as unknown as RescoringSummaryDto;
      this.repository.update(rescoring.id, { summary: { ...summary, mailsSent: sent } });
      this.deps.logger.info({ rescoringId: rescoring.id, mailsSent: sent,
        mailsWaiting: mailIds.length - sent }, 'sent the e-mails of a finished re-scoring');
    } catch (error) {
      this.deps.logger.error({ err: error, rescoringId: rescoring.id },
        'could not send the e-mails of a finished re-scoring');
    }
  }
}

/** The DTO of a re-scoring row. */
export function toRescoringDto(row: RescoringRecord): RescoringRunDto {
  const isActive = ACTIVE.includes(row.status);
  return {
    id: row.id,
    quarterLabel: row.quarterLabel,
    networkVersionId: row.networkVersionId,
    analysisRunId: row.analysisRunId,
    status: row.status,
    trigger: row.trigger,
    isForced: row.isForced,
    attempts: row.attempts,
    progress: row.status === 'succeeded' ? 1 : (row.runProgress ?? 0),
    stage: isActive ? row.runStage : null,
    summary: (row.summary ?? null) as RescoringSummaryDto | null,
    error: row.error,
    startedBy: row.startedBy === null ? null
      : { id: row.startedBy, name: row.startedByName ?? '' },
    createdAt: row.createdAt,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
  };
}
