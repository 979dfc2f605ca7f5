/**
 * `node --import tsx tests/bench/measure-api.ts [--suppliers 10000] [--seconds 10]
 * [--connections 10]`: latency and throughput of the hottest reads of a risk manager's day,
 * through the real HTTP stack, on a large seeded network.
 *
 * 1. Builds `generateTieredNetwork({seed: 20240601, suppliers: 10000})` and stores it as a
 *    network version with `insertNetworkVersion` in a file database in a temporary folder
 *    (seeded with the demo accounts, whose Bearer tokens are signed like a login's).
 * 2. Runs one analysis through the run service (worker thread, results stored in one
 *    transaction with the register sync) and times it.
 * 3. Starts the app (`createApp`) on 127.0.0.1 in a child process (so the load generator
 *    does not share the server's event loop) and measures each endpoint with autocannon for
 *    `--seconds` with `--connections` concurrent connections: the ranking sorted by revenue
 *    impact, the same with `ratingBand=high`, and the register's first page (null when the
 *    register answers 404). Latency percentiles are computed from every response's time;
 *    `firstRequestMs` is the one request before, which for a run loads its sort keys.
 *
 * Prints one JSON line. The target is p95 under 100 ms for each endpoint.
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { cpus, tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { importBatches, openDatabase } from '@keelson/db';
import { generateTieredNetwork } from '@keelson/supply-graph/testing';
import { createApp } from '../../apps/api/src/app';
import { createPasswordHasher } from '../../apps/api/src/auth/password-hasher';
import { SessionTokens } from '../../apps/api/src/auth/session-token';
import { loadConfig } from '../../apps/api/src/config/app-config';
import { createLogger } from '../../apps/api/src/http/request-logging';
import { createSmtpMailer } from '../../apps/api/src/mail/mailer';
import { insertNetworkVersion } from '../../apps/api/src/network/network-store';
import { RunsService } from '../../apps/api/src/runs/runs.service';
import { seedDemoWorkspace } from '../../apps/api/src/seed/demo-workspace';

/** The part of autocannon's API this script uses (the package ships no types). */
interface AutocannonInstance {
  on(event: 'response', listener: (client: unknown, status: number, bytes: number,
    responseTime: number) => void): void;
  then: Promise<AutocannonResult>['then'];
}
interface AutocannonResult {
  requests: { average: number; total: number };
  non2xx: number;
  errors: number;
}
type Autocannon = (options: { url: string; connections: number; duration: number;
  headers: Record<string, string> }) => AutocannonInstance;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

const { values } = parseArgs({
  options: {
    suppliers: { type: 'string', default: '10000' },
    seconds: { type: 'string', default: '10' },
    connections: { type: 'string', default: '10' },
    serve: { type: 'string' },
    user: { type: 'string' },
  },
});
const SEED = 20240601;
const suppliers = Number(values.suppliers);
const seconds = Number(values.seconds);
const connections = Number(values.connections);

const round = (value: number, places = 2) => Math.round(value * 10 ** places) / 10 ** places;

if (values.serve !== undefined) {
  await serve(values.serve, Number(values.user));
} else {
  await measureAll();
}

/** Parent mode: builds the network and the run, serves them, measures, prints the line. */
async function measureAll(): Promise<void> {
  const folder = mkdtempSync(join(tmpdir(), 'keelson-bench-api-'));
  const databasePath = join(folder, 'keelson.db');
  try {
    const database = openDatabase(databasePath);
    await seedDemoWorkspace(database.db, { hashPassword: createPasswordHasher(4).hash });
    const riskManager = database.sqlite.prepare("select id from users where role = 'risk_manager'")
      .get() as { id: number };

    let started = performance.now();
    const model = generateTieredNetwork({ seed: SEED, suppliers });
    const createdAt = new Date().toISOString();
    const versionId = database.db.transaction((tx) => {
      const batchId = tx.insert(importBatches).values({
        status: 'committed', fileName: `bench-${suppliers}.xlsx`, fileSize: 0,
        sha256: '00'.repeat(32), format: 'xlsx', sheets: [], counts: {}, errors: [],
        warnings: [], errorCount: 0, warningCount: 0, createdBy: riskManager.id, createdAt,
        committedAt: createdAt,
      }).returning({ id: importBatches.id }).get().id;
      return insertNetworkVersion(tx, model, { importBatchId: batchId, label: 'Bench network',
        createdBy: riskManager.id, createdAt, previousVersionId: null, changes: {} }).id;
    });
    const storeSeconds = round((performance.now() - started) / 1000);

    started = performance.now();
    const runs = new RunsService({ db: database.db, now: () => new Date() });
    const queued = runs.start(null, { networkVersionId: versionId, label: 'Bench run' });
    const run = await runs.settled(queued.id);
    if (run.status !== 'succeeded') throw new Error(`The bench run ${run.status}: ${run.error}`);
    const runSeconds = round((performance.now() - started) / 1000);
    database.close();

    // The server runs in its own process, so that autocannon does not share its event loop.
    const server = spawn(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url),
      '--serve', databasePath, '--user', String(riskManager.id)],
    { stdio: ['ignore', 'pipe', 'inherit'] });
    const { port, token } = await new Promise<{ port: number; token: string }>((resolve) => {
      createInterface({ input: server.stdout! }).once('line', (line) => resolve(JSON.parse(line)));
    });
    const base = `http://127.0.0.1:${port}`;
    const headers = { authorization: `Bearer ${token}` };

    const endpoints = {
      ranking: `/api/analysis-runs/${run.id}/suppliers?limit=50&sort=revenueImpact&order=desc`,
      rankingFiltered: `/api/analysis-runs/${run.id}/suppliers?limit=50&sort=revenueImpact` +
        '&order=desc&ratingBand=high',
      register: '/api/register?limit=50',
    };
    const measured: Record<string, unknown> = {};
    for (const [name, path] of Object.entries(endpoints)) {
      const probeStarted = performance.now();
      const probe = await fetch(base + path, { headers });
      await probe.arrayBuffer();
      // The first read of a run also loads its sort keys into memory (run-ranking-index.ts).
      const firstRequestMs = round(performance.now() - probeStarted);
      if (probe.status === 404) {
        measured[name] = null;
        continue;
      }
      if (probe.status !== 200) throw new Error(`${path} answered ${probe.status}`);
      measured[name] = { firstRequestMs, ...(await measure(base + path, headers)) };
    }
    server.kill('SIGTERM');

    process.stdout.write(`${JSON.stringify({
      suppliers,
      seed: SEED,
      sourcingRows: model.sourcing.length,
      storeSeconds,
      runSeconds,
      // Of which: the engine in the worker, and scoring and writing the rows on the API thread.
      analysisMs: round(run.timings?.total ?? NaN, 0),
      storingResultsMs: round(run.timings?.['storing results'] ?? NaN, 0),
      connections,
      seconds,
      cores: cpus().length,
      endpoints: measured,
    })}\n`);
  } finally {
    rmSync(folder, { recursive: true, force: true });
}
}

/** Latency percentiles (ms, from every response) and requests per second of one URL. */
async function measure(url: string, headers: Record<string, string>) {
  const times: number[] = [];
  const instance = autocannon({ url, connections, duration: seconds, headers });
  instance.on('response', (_client, _status, _bytes, responseTime) => times.push(responseTime));
  const result = await instance;
  times.sort((a, b) => a - b);
  const percentile = (p: number) => round(times[Math.min(times.length - 1,
    Math.ceil((p / 100) * times.length) - 1)] ?? NaN);
  return {
    p50: percentile(50),
    p95: percentile(95),
    p99: percentile(99),
    requestsPerSecond: round(result.requests.average, 1),
    requests: result.requests.total,
    non2xx: result.non2xx,
    errors: result.errors,
  };
}

/** Child mode: serves the app on the database and prints `{port, token}` as one line. */
async function serve(databasePath: string, userId: number): Promise<void> {
  const config = loadConfig({}, { mode: 'test', databasePath, port: 0, smtpUrl: null,
    publicUrl: 'http://127.0.0.1', webRoot: '/nonexistent/keelson-web-build' });
  const served = openDatabase(databasePath);
  const app = createApp({ config, db: served.db, logger: createLogger('silent'),
    mailer: createSmtpMailer({ host: '127.0.0.1', port: 9 }, config.mailFrom) });
  const server = await new Promise<Server>((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const port = (server.address() as AddressInfo).port;
  const token = new SessionTokens(config.jwtSecret).sign(userId, 'risk_manager');
  process.stdout.write(`${JSON.stringify({ port, token })}\n`);
  process.once('SIGTERM', () => {
    server.close();
    served.close();
    process.exit(0);
  });
}
