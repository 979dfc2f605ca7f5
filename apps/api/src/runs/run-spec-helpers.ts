/**
 * Shared steps of the run specs: start a run through the API and wait for its end, read the
 * demo workbook the way `npm run analyze` does, and collect a server-sent event stream.
 */
import { readFileSync } from 'node:fs';
import request from 'supertest';
import type { AnalysisRunDto, Role, RunProgressEvent, SupplyModel } from '@keelson/contracts';
import { readWorkbook } from '@keelson/workbook';
import { DEMO_WORKBOOK_PATH } from '../seed/demo-network';
import { ACCOUNT_OF_ROLE, type TestApp } from '../testing/test-app';

/** Bearer-authenticated GET as a role. */
export function getAs(t: TestApp, path: string, role: Role = 'viewer') {
  return request(t.app).get(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`);
}

/** Bearer-authenticated POST as a role. */
export function postAs(t: TestApp, path: string, body: object, role: Role = 'risk_manager') {
  return request(t.app).post(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`).send(body);
}

/** Polls a run until it has finished (succeeded, failed or cancelled). */
export async function waitForRun(t: TestApp, id: number): Promise<AnalysisRunDto> {
  for (;;) {
    const response = await getAs(t, `/api/analysis-runs/${id}`);
    const run = response.body as AnalysisRunDto;
    if (['succeeded', 'failed', 'cancelled'].includes(run.status)) return run;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** Starts a run of a version as a risk manager and waits for it; returns the finished run. */
export async function runToEnd(t: TestApp, networkVersionId = 1, label = 'Spec run'):
  Promise<AnalysisRunDto> {
  const started = await postAs(t, '/api/analysis-runs', { networkVersionId, label });
  if (started.status !== 202) throw new Error(`start answered ${started.status}`);
  return waitForRun(t, (started.body as { id: number }).id);
}

/** The demo workbook read with the workbook library, as tools/analyze.ts reads it. */
export async function demoModel(): Promise<SupplyModel> {
  const read = await readWorkbook(new Uint8Array(readFileSync(DEMO_WORKBOOK_PATH)));
  if (!read.model) throw new Error('The demo workbook did not read.');
  return read.model;
}

/** Parses a `text/event-stream` body into its `progress` events. */
export function progressEvents(text: string): RunProgressEvent[] {
  return text.split('\n\n').flatMap((block) => {
    const lines = block.split('\n');
    if (!lines.includes('event: progress')) return [];
    const data = lines.find((line) => line.startsWith('data: '));
    return data ? [JSON.parse(data.slice(6)) as RunProgressEvent] : [];
  });
}

/** Reads a whole event stream (it ends when the run ends) as text. */
export function streamText(response: request.Response,
  callback: (error: Error | null, body: string) => void): void {
  let text = '';
  response.setEncoding('utf8');
  response.on('data', (chunk: string) => (text += chunk));
  response.on('end', () => callback(null, text));
}
