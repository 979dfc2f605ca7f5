/**
 * Worker-thread side of {@link evaluateWhatIfInWorker}: evaluates the what-if on the model it
 * was started with and posts the two sides, or the error as plain data (an `AppError` keeps its
 * code, status and details, so a bad change still answers 400 naming its field).
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { PlanChange, SupplyModel } from '@keelson/contracts';
import { AppError } from '../http/app-error';
import { evaluateWhatIf, type WhatIfContext, type WhatIfSides } from './what-if';

/** What the worker is started with (`workerData`). */
export interface WhatIfWorkerInput {
  model: SupplyModel;
  supplierCode: string;
  changes: PlanChange[];
  context: WhatIfContext;
}

/** An error as plain data. */
export interface SerialisedWhatIfError {
  name: string;
  message: string;
  code?: string;
  status?: number;
  details?: unknown;
}

/** The worker's one message. */
export type WhatIfWorkerMessage =
  | { type: 'result'; sides: WhatIfSides }
  | { type: 'error'; error: SerialisedWhatIfError };

if (!parentPort) throw new Error('what-if-worker.ts must run in a worker thread');
const input = workerData as WhatIfWorkerInput;
let message: WhatIfWorkerMessage;
try {
  message = { type: 'result',
    sides: evaluateWhatIf(input.model, input.supplierCode, input.changes, input.context) };
} catch (error) {
  message = { type: 'error', error: error instanceof AppError
    ? { name: error.name, message: error.message, code: error.code, status: error.status,
      details: error.details }
    : { name: error instanceof Error ? error.name : 'Error',
      message: error instanceof Error ? error.message : String(error) } };
}
parentPort.postMessage(message);
