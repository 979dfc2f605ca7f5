import type { AnalysisRunDto, RatingBand, RunStatus } from '@keelson/contracts';

const STATUS_WORDS: Record<RunStatus, string> = {
  queued: 'Waiting to start',
  running: 'Running',
  succeeded: 'Finished',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

/** A run's status in words, for its chip. */
export function statusLabel(status: RunStatus): string {
  return STATUS_WORDS[status];
}

/** The chip modifier of a status (the colours live in run-chips.scss). */
export function statusClass(status: RunStatus): string {
  return `kl-run-status kl-run-status--${status}`;
}

/** The engine's stage as a sentence ("Working on: betweenness"); empty stages read plainly. */
export function stageLabel(status: RunStatus, stage: string | null): string {
  if (status === 'queued') {
    return 'Waiting for the engine';
  }
  if (status !== 'running') {
    return statusLabel(status);
  }
  return stage ? `Working on: ${stage}` : 'Starting';
}

/** A rating band in words. */
export function ratingBandLabel(band: RatingBand): string {
  return band.charAt(0).toUpperCase() + band.slice(1);
}

/** The chip modifier of a rating band. */
export function ratingBandClass(band: RatingBand): string {
  return `kl-band kl-band--${band}`;
}

/** "2 min 5 s", "850 ms"; null when the run has not both started and finished. */
export function runDuration(run: Pick<AnalysisRunDto, 'startedAt' | 'finishedAt'>):
  string | null {
  if (!run.startedAt || !run.finishedAt) {
    return null;
  }
  const ms = Date.parse(run.finishedAt) - Date.parse(run.startedAt);
  if (!Number.isFinite(ms) || ms < 0) {
    return null;
  }
  if (ms < 1000) {
    return `${Math.round(ms)} ms`;
  }
  const seconds = Math.round(ms / 1000);
  if (seconds < 60) {
    return `${seconds} s`;
  }
  const minutes = Math.floor(seconds / 60);
  return `${minutes} min ${seconds % 60} s`;
}

/** The default label of a new run: "Review 2 Dec 2026". */
export function defaultRunLabel(now: Date = new Date()): string {
  const date = now.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
  return `Review ${date}`;
}
