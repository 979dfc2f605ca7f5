import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@keelson/contracts';
import { ZodError } from 'zod';
import { AppError } from './app-error';

/** Errors thrown by body-parser carry these fields. */
interface HttpLikeError {
  type?: string;
  status?: number;
  statusCode?: number;
  expose?: boolean;
}

/** Answers 404 `not_found` in JSON for every `/api` path no route matched. */
export const apiNotFoundHandler: RequestHandler = (req, _res, next) => {
  const path = req.originalUrl.split('?')[0] ?? req.originalUrl;
  next(new AppError('not_found', 404, `There is no ${req.method} ${path} in the API.`));
};

/**
 * The central error handler: maps {@link AppError}, zod errors and body-parser errors to their
 * status and the `{error: {code, message, details}}` body; everything else becomes 500
 * `internal`, logged with its stack on the request's logger and never sent to the client.
 */
export const errorHandler: ErrorRequestHandler = (error, req, res, next) => {
  if (res.headersSent) {
    next(error);
    return;
  }
  const mapped = toAppError(error);
  if (mapped.status >= 500) {
    req.log?.error({ err: error }, 'request failed');
  }
  const body: ApiErrorBody = { error: { code: mapped.code, message: mapped.message } };
  if (mapped.details !== undefined) {
    body.error.details = mapped.details;
  }
  res.status(mapped.status).json(body);
};

function toAppError(error: unknown): AppError {
  if (error instanceof AppError) {
    return error;
  }
  if (error instanceof ZodError) {
    const issues = error.issues.map((issue) => ({
      path: issue.path.map(String).join('.'),
      message: issue.message,
    }));
    return new AppError('invalid_request', 400, 'The request is not valid.', { issues });
  }
  const http = (error ?? {}) as HttpLikeError;
  const status = http.status ?? http.statusCode;
  if (http.type === 'entity.too.large') {
    return new AppError('payload_too_large', 413, 'The request body is too large.');
  }
  if (http.type === 'entity.parse.failed') {
    return new AppError('invalid_json', 400, 'The request body is not valid JSON.');
  }
  if (http.type === 'encoding.unsupported' || http.type === 'charset.unsupported') {
    return new AppError('unsupported_encoding', 415, 'The request body encoding is not supported.');
  }
  if (typeof status === 'number' && status >= 400 && status < 500 && http.expose) {
    return new AppError('bad_request', status, 'The request could not be read.');
  }
  return new AppError('internal', 500, 'Something went wrong on the server. Please try again.');
}
