/**
 * Shared steps of the re-scoring specs: start one through the API and wait for its end, read
 * the register and the scores back with SQL, and mount the re-scoring module a second time on
 * its own run service (with its own queue and a scheduler of the spec's choosing) over a test
 * app's database, mailer and clock.
 */
import express from 'express';
import type { RescoringRunDto, Role } from '@keelson/contracts';
import type { FeatureDeps } from '../feature-deps';
import { createLogger } from '../http/request-logging';
import { MailOutbox } from '../mail/mail-outbox';
import { NetworkGraphCache } from '../network/network-graph-cache';
import type { DigestScheduler } from '../notifications/digest-schedule';
import { RunQueue } from '../runs/run-queue';
import { getAs, postAs } from '../runs/run-spec-helpers';
import { RunsService, type Analyser } from '../runs/runs.service';
import type { TestApp } from '../testing/test-app';
import { mountRescoringRoutes, type MountedRescoring } from './rescoring.module';

/** Polls a re-scoring until it is neither queued nor running. */
export async function waitForRescoring(t: TestApp, id: number): Promise<RescoringRunDto> {
  for (;;) {
    const response = await getAs(t, `/api/rescoring/${id}`);
    if (response.status !== 200) throw new Error(`GET answered ${response.status}`);
    const rescoring = response.body as RescoringRunDto;
    if (!['queued', 'running'].includes(rescoring.status)) return rescoring;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** Starts a re-scoring through the API (risk manager unless given) and waits for its end. */
export async function rescoreToEnd(t: TestApp, body: object, role: Role = 'risk_manager'):
  Promise<RescoringRunDto> {
  const started = await postAs(t, '/api/rescoring', body, role);
  if (started.status !== 202) throw new Error(`start answered ${started.status}: ${started.text}`);
  return waitForRescoring(t, (started.body as RescoringRunDto).id);
}

/** One register entry as the specs compare it. */
export interface EntryRow {
  id: number;
  supplier_code: string;
  rating: number;
  rating_band: string;
  flag: string | null;
  updated_at: string;
}

/** Every register entry, by id. */
export function entryRows(t: TestApp): EntryRow[] {
  return t.database.sqlite.prepare('select id, supplier_code, rating, rating_band, flag, ' +
    'updated_at from register_entries order by id').all() as EntryRow[];
}

/** The score rows of one re-scoring, by entry id. */
export function scoreRows(t: TestApp, rescoringId: number): {
  entry_id: number; rating: number; previous_rating: number | null; flag: string | null;
  revenue_impact: number | null; }[] {
  return t.database.sqlite.prepare('select entry_id, rating, previous_rating, flag, ' +
    'revenue_impact from register_entry_scores where rescoring_run_id = ? order by entry_id')
    .all(rescoringId) as ReturnType<typeof scoreRows>;
}

/** A second copy of the module, on its own run service, with the closers it registered. */
export interface SecondRescoring extends MountedRescoring {
  runs: RunsService;
  close(): Promise<void>;
}

/**
 * Mounts the module on a fresh Express app over `t`'s database, mailer and clock, with a run
 * service of its own (own queue; the engine runner of the spec's choosing).
 */
export function mountSecondRescoring(t: TestApp, options: {
  scheduler?: DigestScheduler | null; analyser?: Analyser; logger?: FeatureDeps['logger'];
} = {}): SecondRescoring {
  const closers: (() => void | Promise<void>)[] = [];
  const deps: FeatureDeps = {
    config: t.config,
    db: t.database.db,
    logger: options.logger ?? createLogger('silent'),
    now: () => t.clock.now,
    plants: { managersOf: () => [] } as unknown as FeatureDeps['plants'],
    graphs: new NetworkGraphCache(t.database.db),
    mailer: t.mailer,
    outbox: new MailOutbox({ db: t.database.db, mailer: t.mailer,
      logger: options.logger ?? createLogger('silent'), now: () => t.clock.now }),
    onClose: (close) => void closers.push(close),
  };
  const runs = new RunsService({ db: t.database.db, now: () => t.clock.now,
    analyser: options.analyser, queue: new RunQueue() });
  // No scheduler given: the module's own choice (none in test mode).
  const mounted = mountRescoringRoutes(express(), deps, runs,
    'scheduler' in options ? { scheduler: options.scheduler } : {});
  return { ...mounted, runs, async close() {
    for (const close of closers.splice(0).reverse()) await close();
  } };
}

/** How many rows a table holds for a condition. */
export function countOf(t: TestApp, sql: string, ...params: unknown[]): number {
  return (t.database.sqlite.prepare(`select count(*) as n from ${sql}`).get(...params) as
    { n: number }).n;
}
