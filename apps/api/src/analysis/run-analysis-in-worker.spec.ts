/**
 * The worker runner on generated networks: same result as in-process, progress events in order,
 * cancellation terminates the worker, named errors survive the thread boundary, and the event
 * loop keeps turning while the worker computes.
 */
import { analyse, AnalysisCancelledError, UnknownSupplierError } from '@keelson/supply-graph';
import { generateTieredNetwork, WORKED_EXAMPLE } from '@keelson/supply-graph/testing';
import { describe, expect, it } from 'vitest';
import { runAnalysisInWorker } from './run-analysis-in-worker';

describe('runAnalysisInWorker', () => {
  it('returns what analyse() returns in-process, with progress from 0 to 1', async () => {
    const model = generateTieredNetwork({ seed: 11, suppliers: 600, cycles: 5 });
    const events: Array<[number, string]> = [];
    const result = await runAnalysisInWorker(model, { fail: ['SU-000001'] }, {
      onProgress: (fraction, stage) => events.push([fraction, stage]),
    });
    const local = analyse(model, { fail: ['SU-000001'] });
    expect(result.suppliers).toEqual(local.suppliers);
    expect(result.scenario).toEqual(local.scenario);
    expect(events[0]![0]).toBe(0);
    expect(events.at(-1)![0]).toBe(1);
    expect(events.map(([, stage]) => stage)).toContain('single removals');
    const fractions = events.map(([f]) => f);
    fractions.slice(1).forEach((f, i) => expect(f).toBeGreaterThanOrEqual(fractions[i]!));
  });
  it('keeps the event loop free while the worker computes', async () => {
    const model = generateTieredNetwork({ seed: 12, suppliers: 3000 });
    let ticks = 0;
    const timer = setInterval(() => ticks++, 5);
    await runAnalysisInWorker(model);
    clearInterval(timer);
    expect(ticks).toBeGreaterThan(3);
  });
  it('terminates the worker and rejects with AnalysisCancelledError when aborted', async () => {
    const model = generateTieredNetwork({ seed: 13, suppliers: 5000 });
    const controller = new AbortController();
    const stages: string[] = [];
    const run = runAnalysisInWorker(model, {}, {
      signal: controller.signal,
      onProgress: (_, stage) => {
        stages.push(stage);
        if (stage === 'single removals') controller.abort();
      },
    });
    await expect(run).rejects.toBeInstanceOf(AnalysisCancelledError);
    await expect(run).rejects.toThrow(/single removals/);
    const seen = stages.length;
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(stages.length).toBe(seen);
  });
  it('rejects at once when the signal is already aborted', async () => {
    await expect(
      runAnalysisInWorker(WORKED_EXAMPLE, {}, { signal: AbortSignal.abort() }),
    ).rejects.toBeInstanceOf(AnalysisCancelledError);
  });
  it('passes UnknownSupplierError back with its codes', async () => {
    const error = await runAnalysisInWorker(WORKED_EXAMPLE, { fail: ['S1', 'X1'] }).catch(
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(UnknownSupplierError);
    expect((error as UnknownSupplierError).codes).toEqual(['X1']);
  });
});
