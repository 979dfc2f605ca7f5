/**
 * Runs {@link evaluateWhatIf} in a worker thread: building the two graphs of a large network and
 * removing the supplier takes more than a second at 10 000 suppliers, which would stall every
 * other request on the API's event loop. One what-if runs at a time; the next waits its turn.
 */
import type { PlanChange, SupplyModel } from '@keelson/contracts';
import { startTsWorker } from '../analysis/ts-worker';
import { AppError } from '../http/app-error';
import type { WhatIfContext, WhatIfSides } from './what-if';
import type { WhatIfWorkerInput, WhatIfWorkerMessage } from './what-if-worker';

const workerUrl = new URL('./what-if-worker.ts', import.meta.url);

/** The evaluator a plans service uses; specs may pass {@link evaluateWhatIf} itself. */
export type WhatIfEvaluator = (model: SupplyModel, supplierCode: string,
  changes: PlanChange[], context: WhatIfContext) => Promise<WhatIfSides> | WhatIfSides;

let turn: Promise<unknown> = Promise.resolve();

/**
 * The what-if's two sides, computed in a worker. Rejects with the `AppError` the evaluation
 * threw (a refused change, an unknown supplier) or with the worker's own failure.
 */
export function evaluateWhatIfInWorker(model: SupplyModel, supplierCode: string,
  changes: PlanChange[], context: WhatIfContext): Promise<WhatIfSides> {
  const run = turn.then(() => once({ model, supplierCode, changes, context }));
  turn = run.catch(() => undefined);
  return run;
}

function once(input: WhatIfWorkerInput): Promise<WhatIfSides> {
  return new Promise<WhatIfSides>((resolve, reject) => {
    const worker = startTsWorker(workerUrl, input);
    let settled = false;
    const finish = (outcome: () => void) => {
      if (settled) return;
      settled = true;
      outcome();
    };
    worker.on('message', (message: WhatIfWorkerMessage) => {
      if (message.type === 'result') {
        finish(() => resolve(message.sides));
        return;
      }
      const { error } = message;
      finish(() => reject(error.code !== undefined && error.status !== undefined
        ? new AppError(error.code, error.status, error.message, error.details)
        : Object.assign(new Error(error.message), { name: error.name })));
    });
    worker.on('error', (error) => finish(() => reject(error)));
    worker.on('exit', (code) => finish(() =>
      reject(new Error(`What-if worker stopped with exit code ${code} before a result`))));
  });
}
