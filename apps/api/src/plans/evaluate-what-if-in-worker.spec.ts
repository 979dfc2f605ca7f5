/**
 * The what-if in a worker thread gives what the same evaluation gives on the main thread (the
 * demo network, data/demo/keelson-demo.xlsx, and the plan of the demo: S-2-011 as a second source
 * of M-01 ends S-2-SHARED-A as a single point of failure), and a refused change comes back as
 * the same 400 naming its field.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { SupplyModel } from '@keelson/contracts';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { AppError } from '../http/app-error';
import { demoModel } from '../runs/run-spec-helpers';
import { evaluateWhatIfInWorker } from './evaluate-what-if-in-worker';
import { SECOND_SOURCE } from './plan-test-setup';
import { evaluateWhatIf, type WhatIfContext } from './what-if';

let model: SupplyModel;
const context: WhatIfContext = { hazards: new Map([['DE', 2], ['PL', 3]]),
  settings: SCORING_DEFAULTS, likelihoodOverride: null };
beforeAll(async () => {
  model = await demoModel();
}, 60_000);

describe('evaluateWhatIfInWorker', () => {
  it('answers what the main thread computes, one what-if after the other', async () => {
    const expected = evaluateWhatIf(model, 'S-2-SHARED-A', SECOND_SOURCE, context);
    expect([expected.before.singlePointOfFailure, expected.after.singlePointOfFailure])
      .toEqual([true, false]);
    const [first, second] = await Promise.all([
      evaluateWhatIfInWorker(model, 'S-2-SHARED-A', SECOND_SOURCE, context),
      evaluateWhatIfInWorker(model, 'S-2-SHARED-A', [], context),
    ]);
    expect(first).toEqual(expected);
    expect(second.after).toEqual(expected.before);
  }, 60_000);

  it('rejects with the evaluation\'s AppError, code, status and field intact', async () => {
    const failure = await evaluateWhatIfInWorker(model, 'S-2-SHARED-A', [{ kind: 'add_source',
      itemCode: 'M-404', supplierCode: 'S-2-011', buyerCode: null }], context)
      .catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(AppError);
    expect(failure).toMatchObject({ code: 'invalid_request', status: 400 });
    expect((failure as AppError).message).toContain('changes[0].itemCode');
    const unknown = await evaluateWhatIfInWorker(model, 'S-9-NOPE', [], context)
      .catch((error: unknown) => error);
    expect(unknown).toMatchObject({ status: 404 });
  }, 60_000);
});
