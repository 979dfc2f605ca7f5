/**
 * Runs `analyse()` of `@keelson/supply-graph` in a worker thread so that a large network never
 * blocks the API's event loop. Progress arrives as messages; aborting the signal terminates the
 * worker at once (the engine itself is synchronous) and rejects with `AnalysisCancelledError`.
 */
import type { SupplyModel } from '@keelson/contracts';
import {
  AnalysisCancelledError,
  ConvergenceError,
  UnknownSupplierError,
  type AnalysisResult,
  type AnalysisStage,
} from '@keelson/supply-graph';
import type {
  AnalysisWorkerInput,
  AnalysisWorkerMessage,
  SerialisedError,
} from './analysis-worker';
import { startTsWorker } from './ts-worker';

/** The failure set of the scenario, as in `analyse()`. */
export interface WorkerAnalysisOptions {
  fail?: string[];
  failCountry?: string;
}

/** Progress and cancellation of a worker run. */
export interface WorkerRunHooks {
  onProgress?: (fraction: number, stage: AnalysisStage) => void;
  signal?: AbortSignal;
}

const workerUrl = new URL('./analysis-worker.ts', import.meta.url);

/**
 * Analyses `model` in a new worker thread. Resolves with the analysis; rejects with
 * `UnknownSupplierError`, `ConvergenceError` or `AnalysisCancelledError` as `analyse()` would
 * throw them, or with the worker's own error.
 */
export function runAnalysisInWorker(
  model: SupplyModel,
  options: WorkerAnalysisOptions = {},
  hooks: WorkerRunHooks = {},
): Promise<AnalysisResult> {
  const { signal, onProgress } = hooks;
  if (signal?.aborted) return Promise.reject(new AnalysisCancelledError('start'));
  return new Promise<AnalysisResult>((resolve, reject) => {
    const { fail, failCountry } = options;
    const input: AnalysisWorkerInput = { model, fail, failCountry };
    const worker = startTsWorker(workerUrl, input);
    let stage = 'start';
    let settled = false;
    const finish = (outcome: () => void) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      outcome();
    };
    const onAbort = () => {
      finish(() => reject(new AnalysisCancelledError(stage)));
      void worker.terminate();
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.on('message', (message: AnalysisWorkerMessage) => {
      if (message.type === 'progress') {
        stage = message.stage;
        if (!settled) onProgress?.(message.fraction, message.stage);
      } else if (message.type === 'result') {
        finish(() => resolve(message.result));
      } else {
        finish(() => reject(revive(message.error)));
      }
    });
    worker.on('error', (error) => finish(() => reject(error)));
    worker.on('exit', (code) => {
      const error = new Error(`Analysis worker stopped with exit code ${code} before a result`);
      finish(() => reject(error));
    });
  });
}

/** Turns the worker's plain error back into the engine's named error classes. */
function revive(error: SerialisedError): Error {
  if (error.name === 'UnknownSupplierError') return new UnknownSupplierError(error.codes ?? []);
  if (error.name === 'ConvergenceError') {
    return new ConvergenceError(error.measure ?? 'unknown', error.iterations ?? 0);
  }
  if (error.name === 'AnalysisCancelledError') {
    return new AnalysisCancelledError(error.stage ?? 'unknown');
  }
  const revived = new Error(error.message);
  revived.name = error.name;
  return revived;
}
