import { describe, expect, it } from 'vitest';
import express from 'express';
import supertest from 'supertest';
import { pinoHttp } from 'pino-http';
import { pino } from 'pino';
import { errorHandler } from './errors';
import { notFound } from '../lib/errors';

function appThrowing(err: unknown) {
  const app = express();
  app.use(pinoHttp({ logger: pino({ level: 'silent' }), genReqId: () => 'req-123' }));
  app.get('/boom', async () => {
    throw err;
  });
  app.use(errorHandler);
  return app;
}

describe('error middleware', () => {
  it('turns an unknown error into 500 with a request id and no stack trace', async () => {
    const res = await supertest(appThrowing(new Error('secret internals at /srv/app.ts:12')))
      .get('/boom')
      .expect(500);
    expect(res.body).toEqual({
      error: { code: 'internal_error', message: 'Something went wrong on our side', requestId: 'req-123' },
    });
    expect(res.text).not.toContain('secret internals');
  });

  it('keeps the status and code of an AppError', async () => {
    const res = await supertest(appThrowing(notFound('This culture')))
      .get('/boom')
      .expect(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'This culture was not found' });
  });

  it('maps a lost database connection to 503 with Retry-After', async () => {
    const err = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54329'), { code: 'ECONNREFUSED' });
    const res = await supertest(appThrowing(err)).get('/boom').expect(503);
    expect(res.headers['retry-after']).toBe('5');
    expect(res.body.error.code).toBe('service_unavailable');
  });
});
