/**
 * Worker-thread side of `runAnalysisInWorker`: runs the pure engine on the model it was started
 * with and posts progress, then the result or a plain description of the error. Started with
 * `--import tsx`, so it runs from TypeScript source like the rest of the API.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { SupplyModel } from '@keelson/contracts';
import {
  analyse,
  AnalysisCancelledError,
  ConvergenceError,
  UnknownSupplierError,
} from '@keelson/supply-graph';
import type { AnalysisStage } from '@keelson/supply-graph';

/** What the worker is started with (`workerData`). */
export interface AnalysisWorkerInput {
  model: SupplyModel;
  fail?: string[];
  failCountry?: string;
}

/** Messages from the worker to the thread that started it. */
export type AnalysisWorkerMessage =
  | { type: 'progress'; fraction: number; stage: AnalysisStage }
  | { type: 'result'; result: ReturnType<typeof analyse> }
  | { type: 'error'; error: SerialisedError };

/** An error as plain data (class instances do not survive postMessage with their type). */
export interface SerialisedError {
  name: string;
  message: string;
  codes?: string[];
  stage?: string;
  measure?: string;
  iterations?: number;
}

function serialise(error: unknown): SerialisedError {
  if (error instanceof UnknownSupplierError) {
    return { name: error.name, message: error.message, codes: [...error.codes] };
  }
  if (error instanceof ConvergenceError) {
    const { name, message, measure, iterations } = error;
    return { name, message, measure, iterations };
  }
  if (error instanceof AnalysisCancelledError) {
    return { name: error.name, message: error.message, stage: error.stage };
  }
  const plain = error instanceof Error ? error : new Error(String(error));
  return { name: plain.name, message: plain.message };
}

if (!parentPort) throw new Error('analysis-worker.ts must run in a worker thread');
const port = parentPort;
const input = workerData as AnalysisWorkerInput;
let lastFraction = -1;
let lastStage = '';
try {
  const result = analyse(input.model, {
    fail: input.fail,
    failCountry: input.failCountry,
    onProgress: (fraction, stage) => {
      // At most about a hundred messages per run, plus one per stage.
      if (stage === lastStage && fraction - lastFraction < 0.01 && fraction < 1) return;
      lastFraction = fraction;
      lastStage = stage;
      port.postMessage({ type: 'progress', fraction, stage } satisfies AnalysisWorkerMessage);
    },
  });
  port.postMessage({ type: 'result', result } satisfies AnalysisWorkerMessage);
} catch (error) {
  port.postMessage({ type: 'error', error: serialise(error) } satisfies AnalysisWorkerMessage);
}
