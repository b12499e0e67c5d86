import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { FieldIssue } from '../shared/model/spool';
import type { Logger } from './logger';

export type ErrorCode =
  | 'bad_request'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'invalid_transition'
  | 'check_failed'
  | 'open_comments'
  | 'gone'
  | 'payload_too_large'
  | 'validation'
  | 'rate_limited'
  | 'busy'
  | 'internal';

/** An error with an HTTP status that reaches the client as `{ error: { code, message, details } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const notFound = (what = 'Not found') => new HttpError(404, 'not_found', what);
export const forbidden = (message = 'Your role does not allow this') =>
  new HttpError(403, 'forbidden', message);
export const validationError = (
  issues: readonly FieldIssue[],
  message = 'The request has invalid fields',
) => new HttpError(422, 'validation', message, issues);

/** JSON 404 for unknown /api routes (never the SPA page). */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(
    new HttpError(
      404,
      'not_found',
      `No route ${req.method} ${req.originalUrl.split('?')[0] ?? ''}`,
    ),
  );
};

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
}

/** Last middleware: known errors keep their status; anything else is a 500 without internals. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    let status = 500;
    let body: { code: ErrorCode; message: string; details?: unknown };
    const bp = err as BodyParserError;
    if (err instanceof HttpError) {
      status = err.status;
      body = {
        code: err.code,
        message: err.message,
        ...(err.details === undefined ? {} : { details: err.details }),
      };
    } else if (bp?.type === 'entity.too.large') {
      status = 413;
      body = {
        code: 'payload_too_large',
        message: 'The request body is larger than the server accepts',
      };
    } else if (bp?.type === 'entity.parse.failed') {
      status = 400;
      body = {
        code: 'bad_request',
        message: 'The request body is not valid JSON',
        details: [{ path: 'body', message: 'is not valid JSON' }],
      };
    } else if (err instanceof URIError) {
      // The router could not percent-decode a path segment (e.g. `%E0%A4%A`).
      status = 400;
      body = {
        code: 'bad_request',
        message: 'The URL is not valid percent-encoding',
        details: [{ path: 'params', message: 'is not valid percent-encoding' }],
      };
    } else if (bp?.expose && typeof bp.status === 'number' && bp.status >= 400 && bp.status < 500) {
      status = bp.status;
      body = { code: 'bad_request', message: (err as Error).message };
    } else {
      logger.error(`${req.method} ${req.path} failed`, err);
      body = { code: 'internal', message: 'Something went wrong on the server' };
    }
    res.status(status).json({ error: body });
  };
}
