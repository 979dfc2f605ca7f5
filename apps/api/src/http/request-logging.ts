import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import { pino, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import type { LogLevel } from '../config/app-config';

/** The header that carries the request id both ways. */
export const REQUEST_ID_HEADER = 'X-Request-Id';

/** Request ids accepted from a client: short, plain characters only (no log injection). */
const INCOMING_ID = /^[A-Za-z0-9._:-]{1,100}$/;

/** Paths never written to logs in full: session material. */
export const REDACTED_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'req.headers["x-keelson-csrf"]',
  'res.headers["set-cookie"]',
];

/** Creates the application logger (JSON to stdout; `silent` writes nothing). */
export function createLogger(level: LogLevel): Logger {
  return pino({ level, redact: { paths: REDACTED_PATHS, censor: '[redacted]' } });
}

/**
 * pino-http middleware: one log line per request with its id, which is taken from a valid
 * incoming `X-Request-Id` or made with `crypto.randomUUID()`, and echoed in the response.
 */
export function requestLogging(logger: Logger): RequestHandler {
  return pinoHttp({
    logger,
    genReqId(req, res) {
      const incoming = req.headers['x-request-id'];
      const isUsable = typeof incoming === 'string' && INCOMING_ID.test(incoming);
      const id = isUsable ? incoming : randomUUID();
      res.setHeader(REQUEST_ID_HEADER, id);
      return id;
    },
    customLogLevel(_req, res, error) {
      if (error || res.statusCode >= 500) return 'error';
      if (res.statusCode >= 400) return 'warn';
      return 'info';
    },
    serializers: {
      req: (req: { id: unknown; method: string; url: string }) => ({
        id: req.id,
        method: req.method,
        url: req.url,
      }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  }) as unknown as RequestHandler;
}
