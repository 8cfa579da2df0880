import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@barmkeep/schemas';
import { AppError, notFound } from '../lib/errors';

const CONNECTION_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', '57P01', '57P03', 'EPIPE']);

function isDatabaseDown(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false;
  const e = err as { code?: string; message?: string; cause?: unknown };
  if (e.code && CONNECTION_CODES.has(e.code)) return true;
  if (typeof e.message === 'string' && /Connection terminated|timeout exceeded when trying to connect/i.test(e.message))
    return true;
  return e.cause ? isDatabaseDown(e.cause) : false;
}

/** PostgreSQL class 22 (data exception): the input could not be stored as given. */
const isDataException = (err: unknown) =>
  !!err &&
  typeof err === 'object' &&
  typeof (err as { code?: unknown }).code === 'string' &&
  /^22[0-9A-Z]{3}$/.test((err as { code: string }).code);

/** An http-errors style 4xx from Express or a parser (e.g. a path that is not valid UTF-8). */
const clientStatusOf = (err: unknown): number | undefined => {
  const status =
    err && typeof err === 'object'
      ? ((err as { status?: unknown; statusCode?: unknown }).status ?? (err as { statusCode?: unknown }).statusCode)
      : undefined;
  return typeof status === 'number' && status >= 400 && status < 500 ? status : undefined;
};

export const apiNotFound: RequestHandler = (_req, _res, next) => next(notFound('This API route'));

/** The one place errors become responses. Never sends a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id ?? '');
  let status = 500;
  let body: ApiErrorBody;
  if (err instanceof AppError) {
    status = err.status;
    body = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } };
  } else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.parse.failed') {
    status = 400;
    body = { error: { code: 'malformed_json', message: 'The request body is not valid JSON' } };
  } else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.too.large') {
    status = 413;
    body = { error: { code: 'payload_too_large', message: 'The request body is too large' } };
  } else if (clientStatusOf(err) || err instanceof URIError) {
    status = clientStatusOf(err) ?? 400;
    body = { error: { code: 'bad_request', message: 'The request could not be read' } };
  } else if (isDataException(err)) {
    // a value the schema let through but the database cannot store; a schema should catch it first
    status = 400;
    req.log?.warn({ err, requestId }, 'input rejected by the database');
    body = { error: { code: 'invalid_input', message: 'Some of the values sent cannot be stored' } };
  } else if (isDatabaseDown(err)) {
    status = 503;
    res.setHeader('Retry-After', '5');
    body = {
      error: { code: 'service_unavailable', message: 'The service is briefly unavailable; try again in a moment' },
    };
  } else {
    body = { error: { code: 'internal_error', message: 'Something went wrong on our side', requestId } };
  }
  if (status >= 500) req.log?.error({ err, requestId }, 'request failed');
  res.status(status).json(body);
};
