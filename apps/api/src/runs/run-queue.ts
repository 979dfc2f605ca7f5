/**
 * The in-process queue of analysis runs: one run at a time per process, the others wait in
 * order. A run is CPU-bound in its worker thread; running two at once would only make both
 * slower and double the memory, so they take turns.
 */

/** A queued unit of work; its promise settles when the run has stored its outcome. */
export type RunJob = () => Promise<void>;

/** A first-in, first-out queue that runs one job at a time. */
export class RunQueue {
  private readonly waiting: { runId: number; job: RunJob }[] = [];
  private active: number | null = null;

  /** Adds a job for run `runId`; it starts when every earlier job has finished. */
  enqueue(runId: number, job: RunJob): void {
    this.waiting.push({ runId, job });
    this.pump();
  }

  /** Takes a run that has not started out of the queue; false when it is not waiting. */
  remove(runId: number): boolean {
    const index = this.waiting.findIndex((entry) => entry.runId === runId);
    if (index === -1) return false;
    this.waiting.splice(index, 1);
    return true;
  }

  /** The run being executed, if any. */
  get activeRunId(): number | null {
    return this.active;
  }

  /** Runs waiting, in order. */
  get waitingRunIds(): number[] {
    return this.waiting.map((entry) => entry.runId);
  }

  private pump(): void {
    if (this.active !== null) return;
    const next = this.waiting.shift();
    if (!next) return;
    this.active = next.runId;
    // The job stores its own failure; the catch only keeps the queue turning if it cannot.
    void next.job().catch(() => undefined).finally(() => {
      this.active = null;
      this.pump();
    });
  }
}

/** The queue of this process: every app built in the process shares it. */
export const processRunQueue = new RunQueue();
