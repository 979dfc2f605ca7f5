/**
 * Named errors of the analysis engine. Each says what went wrong in words a buyer can act on,
 * and carries the details a caller needs to report it (codes, iteration counts).
 */

/** A failure set names codes that are not suppliers of the model. */
export class UnknownSupplierError extends Error {
  override readonly name = 'UnknownSupplierError';
  /** The codes that are not suppliers, in the order first given, without repeats. */
  readonly codes: readonly string[];

  constructor(codes: readonly string[]) {
    super(
      `Unknown supplier code${codes.length === 1 ? '' : 's'} in the failure set: ` +
        codes.map((code) => JSON.stringify(code)).join(', '),
    );
    this.codes = [...codes];
  }
}

/** The caller's signal was aborted; the analysis stopped between two chunks of work. */
export class AnalysisCancelledError extends Error {
  override readonly name = 'AnalysisCancelledError';
  /** The stage that was running when the cancellation was seen. */
  readonly stage: string;

  constructor(stage: string) {
    super(`Analysis cancelled during stage "${stage}".`);
    this.stage = stage;
  }
}

/** A power iteration did not reach its tolerance within the allowed number of iterations. */
export class ConvergenceError extends Error {
  override readonly name = 'ConvergenceError';
  /** The measure that did not converge, e.g. "eigenvector". */
  readonly measure: string;
  /** Iterations performed. */
  readonly iterations: number;

  constructor(measure: string, iterations: number) {
    super(`${measure} power iteration did not converge within ${iterations} iterations.`);
    this.measure = measure;
    this.iterations = iterations;
  }
}

/** A cancellation signal: an `AbortSignal`, or any object with an `aborted` flag. */
export interface CancellationSignal {
  readonly aborted: boolean;
}

/** Progress and cancellation hooks shared by the long-running functions. */
export interface ProgressOptions {
  /** Called with the fraction done (0 to 1) between chunks of work. */
  onProgress?: (fraction: number) => void;
  /** Checked between chunks; when aborted the function throws {@link AnalysisCancelledError}. */
  signal?: CancellationSignal;
}

/** Throws {@link AnalysisCancelledError} when the signal is aborted. */
export function throwIfCancelled(signal: CancellationSignal | undefined, stage: string): void {
  if (signal?.aborted) throw new AnalysisCancelledError(stage);
}
