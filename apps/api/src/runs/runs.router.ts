import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import {
  listRunsQuerySchema,
  listRunSuppliersQuerySchema,
  startRunSchema,
  type RunProgressEvent,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import { runRankingWorkbook } from './run-export';
import type { RunResultsService } from './run-results.service';
import { FINISHED_STATUSES, type RunsService } from './runs.service';

const runParams = z.object({ id: z.coerce.number().int().positive() });
const supplierParams = runParams.extend({ code: z.string().trim().min(1).max(120) });

/** The export's query: the ranking's sort and filters, without paging. */
const exportRunSuppliersQuerySchema = listRunSuppliersQuerySchema.omit({ limit: true,
  offset: true });

/** Seconds between the comment lines that keep an idle event stream open through proxies. */
export const HEARTBEAT_MS = 15_000;

/** Roles that start and cancel runs. */
export const RUN_WRITERS = ['risk_manager', 'admin'] as const;

/** The services behind `/api/analysis-runs`. */
export interface RunsRouterDeps {
  runs: RunsService;
  results: RunResultsService;
}

/**
 * `/api/analysis-runs`: start, list, follow (server-sent events) and cancel runs, and read a
 * succeeded run's ranking, supplier pages, heat map, Pareto head and workbook. Every signed-in
 * role reads (plant managers within their plants); risk managers and admins start and cancel.
 */
export function createRunsRouter(deps: RunsRouterDeps): Router {
  const router = Router();
  const { runs, results } = deps;
  route(router, {
    method: 'post',
    path: '/',
    roles: RUN_WRITERS,
    handler: (req, res) => {
      const input = parseInput(startRunSchema, req.body, 'body');
      const run = runs.start(sessionUser(req), input);
      res.status(202).location(`/api/analysis-runs/${run.id}`).json({ id: run.id });
    },
  });
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(runs.list(parseInput(listRunsQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(runs.get(parseInput(runParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/events',
    roles: SIGNED_IN,
    handler: (req, res) => streamProgress(runs, req, res),
  });
  route(router, {
    method: 'post',
    path: '/:id/cancel',
    roles: RUN_WRITERS,
    handler: (req, res) => {
      res.json(runs.cancel(parseInput(runParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/suppliers',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(runParams, req.params, 'params');
      const query = parseInput(listRunSuppliersQuerySchema, req.query, 'query');
      res.json(results.suppliers(sessionUser(req), id, query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/suppliers/:code',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id, code } = parseInput(supplierParams, req.params, 'params');
      res.json(results.detail(sessionUser(req), id, code));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/heat-map',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(results.heatMap(sessionUser(req), parseInput(runParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/pareto',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(results.pareto(sessionUser(req), parseInput(runParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/export.xlsx',
    roles: SIGNED_IN,
    handler: async (req, res) => {
      const { id } = parseInput(runParams, req.params, 'params');
      // The same sort and filters as the ranking screen, so the file holds what it shows.
      const query = parseInput(exportRunSuppliersQuerySchema, req.query, 'query');
      const { run, rows } = results.everySupplier(sessionUser(req), id, query);
      const bytes = await runRankingWorkbook(run, rows);
      sendXlsx(res, bytes, `keelson-run-${id}-ranking.xlsx`);
    },
  });
  return router;
}

/**
 * Server-sent events of one run: event `progress` with a `RunProgressEvent` now, on every
 * change, and once at the end, after which the stream closes; a comment line every
 * {@link HEARTBEAT_MS}. A run that has already finished gets its one final event.
 */
function streamProgress(runs: RunsService, req: Request, res: Response): void {
  const { id } = parseInput(runParams, req.params, 'params');
  const current = runs.progressOf(id);
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  const send = (event: RunProgressEvent) => {
    res.write(`event: progress\ndata: ${JSON.stringify(event)}\n\n`);
  };
  send(current);
  if (FINISHED_STATUSES.includes(current.status)) {
    res.end();
    return;
  }
  let lastSent = JSON.stringify(current);
  const heartbeat = setInterval(() => res.write(': heartbeat\n\n'), HEARTBEAT_MS);
  const stop = () => {
    clearInterval(heartbeat);
    unsubscribe();
  };
  const unsubscribe = runs.subscribe(id, (event) => {
    const text = JSON.stringify(event);
    if (text !== lastSent) send(event);
    lastSent = text;
    if (FINISHED_STATUSES.includes(event.status)) {
      stop();
      res.end();
    }
  });
  // The response closes when the client goes away (or after `end`): stop listening then.
  res.on('close', stop);
}
