/**
 * Analysis runs: start (queued, then one at a time in a worker thread), progress with its
 * listeners, cancel, and the outcome. A succeeded run stores every result row, its totals and
 * the scoring settings it used, and syncs the register, in one transaction; a failed or
 * cancelled run stores its status and error and no result rows.
 *
 * Other features hook in without owning the run: {@link RunsService.onSucceededInTransaction}
 * runs code inside the succeeded run's one transaction (before or after the register sync; a
 * hook that throws rolls the whole run back and the run fails), and
 * {@link RunsService.onSettled} is called once after a run has finished (committed or not).
 */
import type {
  AnalysisRunDto,
  ListRunsQuery,
  RunProgressEvent,
  RunStatus,
  StartRunInput,
} from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { AnalysisCancelledError } from '@keelson/supply-graph';
import { runAnalysisInWorker } from '../analysis/run-analysis-in-worker';
import { recordAudit } from '../audit/audit-trail';
import { conflict, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { readNetworkModel } from '../network/network-store';
import { syncRegisterFromRun } from '../register/register-sync';
import { loadScoringSettings } from '../settings/scoring-settings.repository';
import { processRunQueue, type RunQueue } from './run-queue';
import { buildRunRows } from './run-rows';
import { RunsRepository, type RunRecord } from './runs.repository';

/** The engine runner (the worker thread by default; specs pass their own). */
export type Analyser = typeof runAnalysisInWorker;

/** Everything {@link RunsService} is built from. */
export interface RunsServiceDeps {
  db: KeelsonDatabase;
  now: () => Date;
  analyser?: Analyser;
  queue?: RunQueue;
}

/** Statuses after which a run never changes. */
export const FINISHED_STATUSES: readonly RunStatus[] = ['succeeded', 'failed', 'cancelled'];

/** Message stored on runs that a server restart interrupted. */
export const RESTART_MESSAGE =
  'The server restarted before this run finished, so it was stopped. Start the run again.';

// Store progress at most every 2 % or 500 ms (a stage change is always stored).
const PROGRESS_STEP = 0.02;
const PROGRESS_INTERVAL_MS = 500;

type Listener = (event: RunProgressEvent) => void;

/** The kind of a run: `manual` (Start run) or `quarterly` (a re-scoring's). */
export type RunKind = AnalysisRunDto['kind'];

/** What {@link RunsService.start} queues: the run's version and label, and its kind. */
export type StartRunRequest = StartRunInput & { kind?: RunKind };

/**
 * Code run inside a succeeded run's transaction, with the transaction, the run's row (status
 * already `succeeded` in `tx`) and the time it finished. Throwing rolls the run back.
 */
export type SucceededRunHook = (tx: KeelsonDatabase, run: RunRecord, finishedAt: Date) => void;

/** Where in the transaction a {@link SucceededRunHook} runs, relative to the register sync. */
export type SucceededHookStage = 'before_register_sync' | 'after_register_sync';

/** Called once after a run has finished (succeeded and committed, failed or cancelled). */
export type SettledRunHook = (run: AnalysisRunDto) => void | Promise<void>;

/** Starts, follows and cancels analysis runs. */
export class RunsService {
  private readonly repository: RunsRepository;
  private readonly analyser: Analyser;
  private readonly queue: RunQueue;
  private readonly controllers = new Map<number, AbortController>();
  private readonly listeners = new Map<number, Set<Listener>>();
  private readonly succeededHooks: { stage: SucceededHookStage; hook: SucceededRunHook }[] = [];
  private readonly settledHooks: SettledRunHook[] = [];
  // Runs whose settled hooks have been called (a cancel and the worker's end both report).
  private readonly announced = new Set<number>();

  constructor(private readonly deps: RunsServiceDeps) {
    this.repository = new RunsRepository(deps.db);
    this.analyser = deps.analyser ?? runAnalysisInWorker;
    this.queue = deps.queue ?? processRunQueue;
  }

  /** Marks runs a restart left `queued` or `running` as failed; returns how many. */
  failInterrupted(): number {
    return this.repository.failUnfinished(RESTART_MESSAGE, this.deps.now().toISOString());
  }

  /**
   * Runs `hook` inside the transaction of every run that succeeds, at `stage` (after the
   * register sync by default), in the order registered; returns the unregister.
   */
  onSucceededInTransaction(hook: SucceededRunHook,
    stage: SucceededHookStage = 'after_register_sync'): () => void {
    const registered = { stage, hook };
    this.succeededHooks.push(registered);
    return () => {
      const index = this.succeededHooks.indexOf(registered);
      if (index !== -1) this.succeededHooks.splice(index, 1);
    };
  }

  /**
   * Calls `hook` once when a run has finished, after its transaction (e-mail goes here). A
   * hook's rejection is swallowed: it reports its own failures.
   */
  onSettled(hook: SettledRunHook): void {
    this.settledHooks.push(hook);
  }

  /** Queues a run of a network version; resolves once it is queued (not finished). */
  start(user: SessionUser | null, input: StartRunRequest): AnalysisRunDto {
    if (!this.repository.versionExists(input.networkVersionId)) {
      throw notFound(`There is no network version ${input.networkVersionId}.`);
    }
    const id = this.repository.insert({
      networkVersionId: input.networkVersionId,
      label: input.label,
      kind: input.kind ?? 'manual',
      createdBy: user?.id ?? null,
      createdAt: this.deps.now().toISOString(),
    });
    this.queue.enqueue(id, () => this.execute(id));
    return this.get(id);
  }

  /** Resolves when run `id` has finished (for scripts and specs). */
  async settled(id: number): Promise<AnalysisRunDto> {
    const run = this.get(id);
    if (FINISHED_STATUSES.includes(run.status)) return run;
    return new Promise((resolve) => {
      const unsubscribe = this.subscribe(id, (event) => {
        if (!FINISHED_STATUSES.includes(event.status)) return;
        unsubscribe();
        resolve(this.get(id));
      });
    });
  }

  /** A page of runs, newest first. */
  list(query: ListRunsQuery): { items: AnalysisRunDto[]; total: number } {
    const { rows, total } = this.repository.list(query);
    return { items: rows.map(toRunDto), total };
  }

  /** One run; 404 when there is none. */
  get(id: number): AnalysisRunDto {
    const row = this.repository.find(id);
    if (!row) throw notFound(`There is no analysis run ${id}.`);
    return toRunDto(row);
  }

  /** Cancels a queued or running run; 409 `run_finished` when it has already finished. */
  cancel(id: number): AnalysisRunDto {
    const run = this.get(id);
    if (FINISHED_STATUSES.includes(run.status)) {
      throw conflict('run_finished', `Run ${id} has already finished (${run.status}); ` +
        'only a queued or running run can be cancelled.', { status: run.status });
    }
    this.queue.remove(id);
    this.repository.update(id, { status: 'cancelled', stage: null,
      error: 'Cancelled before it finished.', finishedAt: this.deps.now().toISOString() },
    ['queued', 'running']);
    this.controllers.get(id)?.abort();
    this.announce(id);
    this.emit(id);
    return this.get(id);
  }

  /** Calls `listener` on every progress change of run `id`; returns the unsubscribe. */
  subscribe(id: number, listener: Listener): () => void {
    const set = this.listeners.get(id) ?? new Set<Listener>();
    set.add(listener);
    this.listeners.set(id, set);
    return () => {
      set.delete(listener);
      if (set.size === 0) this.listeners.delete(id);
    };
  }

  /** The current progress event of a run. */
  progressOf(id: number): RunProgressEvent {
    const run = this.get(id);
    return { id, status: run.status, progress: run.progress, stage: run.stage,
      error: run.error };
  }

  /** Calls the settled hooks once for a finished run. */
  private announce(id: number): void {
    if (this.announced.has(id) || this.settledHooks.length === 0) return;
    const run = this.get(id);
    if (!FINISHED_STATUSES.includes(run.status)) return;
    this.announced.add(id);
    for (const hook of this.settledHooks) {
      try {
        void Promise.resolve(hook(run)).catch(() => undefined);
      } catch {
        // A hook reports its own failures; the run's outcome is already stored.
      }
    }
  }

  private runSucceededHooks(stage: SucceededHookStage, tx: KeelsonDatabase, run: RunRecord,
    finishedAt: Date): void {
    for (const registered of this.succeededHooks) {
      if (registered.stage === stage) registered.hook(tx, run, finishedAt);
    }
  }

  private emit(id: number, event: RunProgressEvent = this.progressOf(id)): void {
    for (const listener of [...(this.listeners.get(id) ?? [])]) listener(event);
  }

  /** Runs the analysis of a queued run and stores its outcome; never rejects. */
  private async execute(id: number): Promise<void> {
    // Let the request that queued the run answer before the version is read (synchronous).
    await new Promise((resolve) => setImmediate(resolve));
    const run = this.repository.find(id);
    if (!run || run.status !== 'queued') return;
    const { now } = this.deps;
    const controller = new AbortController();
    this.controllers.set(id, controller);
    try {
      if (!this.repository.update(id, { status: 'running', progress: 0, stage: null,
        startedAt: now().toISOString() }, ['queued'])) return;
      this.emit(id);
      const model = readNetworkModel(this.deps.db, run.networkVersionId);
      if (!model) throw new Error(`Network version ${run.networkVersionId} is gone.`);
      let stored = { progress: 0, stage: '', at: Date.now() };
      const analysis = await this.analyser(model, {}, {
        signal: controller.signal,
        onProgress: (progress, stage) => {
          const at = Date.now();
          if (stage !== stored.stage || progress - stored.progress >= PROGRESS_STEP ||
            at - stored.at >= PROGRESS_INTERVAL_MS) {
            stored = { progress, stage, at };
            this.repository.update(id, { progress, stage }, ['running']);
          }
          this.emit(id, { id, status: 'running', progress, stage, error: null });
        },
      });
      const storing = performance.now();
      const settings = loadScoringSettings(this.deps.db);
      const rows = buildRunRows(model, analysis, this.repository.hazards(), settings);
      const finishedAt = now();
      this.deps.db.transaction((tx) => {
        this.repository.insertResults(tx, id, rows);
        // Scoring and writing the rows, on the API's thread (the register sync comes after).
        const timings = { ...analysis.timings, 'storing results': performance.now() - storing };
        const isMarked = this.repository.update(id, {
          status: 'succeeded', progress: 1, stage: null, error: null,
          totals: { ...analysis.totals }, timings,
          methods: { ...analysis.methods }, scoringSettings: { ...settings },
          finishedAt: finishedAt.toISOString(),
        }, ['running'], tx);
        // Cancelled while the results were computed: roll everything back.
        if (!isMarked) throw new AnalysisCancelledError('storing');
        const succeeded = this.repository.find(id, tx)!;
        this.runSucceededHooks('before_register_sync', tx, succeeded, finishedAt);
        const synced = syncRegisterFromRun(tx, id, settings, finishedAt);
        this.runSucceededHooks('after_register_sync', tx, succeeded, finishedAt);
        recordAudit(tx, { action: 'run.succeeded', subjectType: 'analysis_run', subjectId: id,
          userId: run.createdBy, after: { networkVersionId: run.networkVersionId,
            suppliers: analysis.totals.suppliers,
            singlePointsOfFailure: analysis.totals.singlePointsOfFailure,
            registerEntriesCreated: synced.created, registerEntriesUpdated: synced.updated } },
        finishedAt);
      });
    } catch (error) {
      if (!(error instanceof AnalysisCancelledError)) {
        const message = error instanceof Error ? error.message : String(error);
        this.repository.update(id, { status: 'failed', stage: null,
          error: `The analysis failed: ${message}`, finishedAt: now().toISOString() },
        ['queued', 'running']);
      } else {
        this.repository.update(id, { status: 'cancelled', stage: null,
          error: 'Cancelled before it finished.', finishedAt: now().toISOString() },
        ['queued', 'running']);
      }
    } finally {
      this.controllers.delete(id);
      this.announce(id);
      this.emit(id);
    }
  }
}

/** The DTO of a run row. */
export function toRunDto(row: RunRecord): AnalysisRunDto {
  return {
    id: row.id,
    networkVersionId: row.networkVersionId,
    label: row.label,
    kind: row.kind,
    status: row.status,
    progress: row.progress,
    stage: row.stage,
    error: row.error,
    createdBy: row.createdBy === null ? null
      : { id: row.createdBy, name: row.createdByName ?? '' },
    createdAt: row.createdAt,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
    timings: row.timings ?? null,
    totals: (row.totals ?? null) as AnalysisRunDto['totals'],
    methods: (row.methods ?? null) as AnalysisRunDto['methods'],
  };
}
