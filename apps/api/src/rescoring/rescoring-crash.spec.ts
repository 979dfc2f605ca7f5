/**
 * Crash safety with a real process: the server (`node --import tsx apps/api/src/main.ts`, demo
 * mode, a file database in a temporary folder) re-scores a generated network of 4 000
 * suppliers imported through the import API, and is killed with SIGKILL while the analysis
 * runs. The file then holds no result rows, no scores and the register exactly as before. The
 * restarted server marks the re-scoring `interrupted`; resumed, it succeeds and writes one
 * score row per entry.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import type { AnalysisRunDto, RescoringRunDto } from '@keelson/contracts';
import { writeWorkbook } from '@keelson/workbook';
import { generatedNetwork } from '../network/network-test-versions';
import { INTERRUPTED_MESSAGE } from './rescoring.service';

const folder = mkdtempSync(join(tmpdir(), 'keelson-crash-'));
const databasePath = join(folder, 'keelson.db');
const env = {
  ...process.env,
  KEELSON_MODE: 'demo',
  DATABASE_PATH: databasePath,
  PORT: '0',
  HOST: '127.0.0.1',
  JWT_SECRET: 'crash-spec-secret-of-at-least-thirty-two-characters',
  LOG_LEVEL: 'info',
  KEELSON_DIGEST_CRON: 'off',
};

let child: ChildProcess | null = null;

afterAll(() => {
  child?.kill('SIGKILL');
  rmSync(folder, { recursive: true, force: true });
});

/** Starts the real server and resolves with its URL once it listens. */
function startServer(): Promise<string> {
  const process_ = spawn(process.execPath, ['--import', 'tsx', 'apps/api/src/main.ts'],
    { cwd: process.cwd(), env, stdio: ['ignore', 'pipe', 'pipe'] });
  child = process_;
  let errors = '';
  process_.stderr!.on('data', (chunk: Buffer) => (errors += chunk.toString()));
  return new Promise((resolve, reject) => {
    const lines = createInterface({ input: process_.stdout! });
    lines.on('line', (line) => {
      try {
        const entry = JSON.parse(line) as { msg?: string; url?: string };
        if (entry.msg?.startsWith('Keelson is listening') && entry.url) resolve(entry.url);
      } catch {
        // Not a log line.
      }
    });
    process_.once('exit', (code) => reject(new Error(`The server exited (${code}): ${errors}`)));
  });
}

/** Kills the server with SIGKILL and waits for it to be gone. */
async function killServer(): Promise<void> {
  const process_ = child!;
  child = null;
  const gone = new Promise((resolve) => process_.once('exit', resolve));
  process_.kill('SIGKILL');
  await gone;
}

async function signIn(url: string, email: string): Promise<string> {
  const response = await fetch(`${url}/api/auth/login`, { method: 'POST',
    headers: { 'content-type': 'application/json', 'x-keelson-csrf': '1' },
    body: JSON.stringify({ email, password: 'keelson-demo' }) });
  if (response.status !== 200) throw new Error(`sign-in answered ${response.status}`);
  return ((await response.json()) as { token: string }).token;
}

async function call<T>(url: string, token: string, path: string, body?: object): Promise<T> {
  const response = await fetch(`${url}${path}`, body === undefined
    ? { headers: { authorization: `Bearer ${token}` } }
    : { method: 'POST', headers: { authorization: `Bearer ${token}`,
      'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (response.status >= 300) {
    throw new Error(`${path} answered ${response.status}: ${await response.text()}`);
  }
  return (await response.json()) as T;
}

async function until<T>(read: () => Promise<T>, isDone: (value: T) => boolean): Promise<T> {
  for (;;) {
    const value = await read();
    if (isDone(value)) return value;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

function readDatabase<T>(read: (db: Database.Database) => T): T {
  const db = new Database(databasePath);
  try {
    return read(db);
  } finally {
    db.close();
  }
}

const entriesOf = (db: Database.Database) =>
  db.prepare('select * from register_entries order by id').all();

describe('a server killed during a re-scoring', () => {
  it('keeps nothing of it, marks it interrupted on restart, and resumes it to the end',
    async () => {
      let url = await startServer();
      const risk = await signIn(url, 'risk@demo.test');
      const buyer = await signIn(url, 'buyer@demo.test');
      // A register to protect: the demo network's entries from a first run.
      const first = await call<{ id: number }>(url, risk, '/api/analysis-runs',
        { networkVersionId: 1, label: 'Before the quarter' });
      await until(() => call<AnalysisRunDto>(url, risk, `/api/analysis-runs/${first.id}`),
        (run) => run.status === 'succeeded');
      // A network large enough for the analysis to be caught mid-run.
      const form = new FormData();
      form.append('file', new Blob([await writeWorkbook(generatedNetwork(11, 4000))]),
        'large-network.xlsx');
      const imported = await fetch(`${url}/api/imports?commit=true`, { method: 'POST',
        headers: { authorization: `Bearer ${buyer}` }, body: form });
      expect(imported.status).toBe(201);
      const versionId = ((await imported.json()) as { networkVersionId: number })
        .networkVersionId;
      const before = readDatabase(entriesOf);
      expect(before.length).toBeGreaterThan(0);

      const started = await call<RescoringRunDto>(url, risk, '/api/rescoring', {});
      expect(started).toMatchObject({ networkVersionId: versionId, status: 'queued' });
      const runId = started.analysisRunId!;
      await until(() => call<AnalysisRunDto>(url, risk, `/api/analysis-runs/${runId}`),
        (run) => {
          if (!['queued', 'running'].includes(run.status)) {
            throw new Error(`The analysis ended (${run.status}) before it could be killed.`);
          }
          return run.status === 'running' && run.progress > 0;
        });
      await killServer();

      readDatabase((db) => {
        expect(db.prepare('select count(*) as n from run_suppliers where run_id = ?')
          .get(runId)).toEqual({ n: 0 });
        expect(db.prepare('select count(*) as n from register_entry_scores where ' +
          'rescoring_run_id = ?').get(started.id)).toEqual({ n: 0 });
        expect(entriesOf(db)).toEqual(before);
        expect(db.prepare('select status from rescoring_runs where id = ?').get(started.id))
          .toEqual({ status: 'running' });
      });

      url = await startServer();
      const again = await signIn(url, 'risk@demo.test');
      const left = await call<RescoringRunDto>(url, again, `/api/rescoring/${started.id}`);
      expect(left).toMatchObject({ status: 'interrupted', error: INTERRUPTED_MESSAGE });
      expect((await call<AnalysisRunDto>(url, again, `/api/analysis-runs/${runId}`)).status)
        .toBe('failed');
      const resumed = await call<RescoringRunDto>(url, again,
        `/api/rescoring/${started.id}/resume`, { mode: 'resume' });
      expect(resumed).toMatchObject({ status: 'queued', attempts: 2,
        networkVersionId: versionId });
      const done = await until(
        () => call<RescoringRunDto>(url, again, `/api/rescoring/${started.id}`),
        (rescoring) => !['queued', 'running'].includes(rescoring.status));
      expect(done.status).toBe('succeeded');
      readDatabase((db) => {
        const entries = db.prepare('select count(*) as n from register_entries').get();
        expect(db.prepare('select count(*) as n from register_entry_scores where ' +
          'rescoring_run_id = ?').get(started.id)).toEqual(entries);
        // The demo's suppliers are not in the generated network: their entries are flagged.
        const gone = db.prepare("select count(*) as n from register_entries where flag = " +
          "'supplier_removed'").get() as { n: number };
        expect(gone.n).toBe(before.length);
        expect(done.summary!.supplierRemoved).toBe(before.length);
      });
      await killServer();
    }, 120_000);
});
