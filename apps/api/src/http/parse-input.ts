import type { z } from 'zod';
import { invalidRequest } from './app-error';

/** Which part of the request a value came from; named in error details. */
export type InputPart = 'body' | 'query' | 'params';

/** One problem with a request, located by its path (`body.email`, `query.limit`). */
export interface InputIssue {
  path: string;
  message: string;
}

/**
 * Parses `value` with `schema`, or throws a 400 `invalid_request` whose details list each issue
 * with its path inside the request (for example `body.plantCodes.2`).
 */
export function parseInput<Schema extends z.ZodType>(
  schema: Schema,
  value: unknown,
  part: InputPart,
): z.output<Schema> {
  const result = schema.safeParse(value ?? {});
  if (result.success) {
    return result.data;
  }
  const issues: InputIssue[] = result.error.issues.map((issue) => ({
    path: [part, ...issue.path.map(String)].join('.'),
    message: issue.message,
  }));
  const first = issues[0];
  throw invalidRequest(
    first
      ? `The request is not valid: ${first.path}: ${first.message}`
      : 'The request is not valid.',
    { issues },
  );
}
