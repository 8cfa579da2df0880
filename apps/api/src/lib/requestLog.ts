import type { IncomingMessage, ServerResponse } from 'node:http';
import { randomUUID } from 'node:crypto';
import { stdSerializers, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

/** Paths whose last part is a secret (a calendar feed's file name, an e-mail preferences token). */
const SECRET_PATH = /^(\/api\/(?:calendar|email-preferences)\/)[^/?#]+/;

/**
 * What a request log line says of the request: its id, method, path (secrets in it masked) and
 * the client's address. No headers — cookies and tokens stay out of the logs — and built straight
 * from the request, without first copying every header as the packaged serializer does.
 */
export function requestForLog(req: IncomingMessage & { id?: unknown; originalUrl?: string }) {
  return {
    id: req.id,
    method: req.method,
    url: (req.originalUrl ?? req.url ?? '').replace(SECRET_PATH, '$1…'),
    remoteAddress: req.socket?.remoteAddress,
  };
}

/** What a response log line says of the response. */
export function responseForLog(res: ServerResponse) {
  return { statusCode: res.statusCode };
}

/**
 * The request logger: every request gets an id (also sent back as X-Request-Id) and a `req.log`;
 * with `autoLogging` each answered request writes one line, through the serializers above (given
 * the raw request and response, not pino's copies).
 */
export function httpLogger(logger: Logger, opts: { autoLogging: boolean }) {
  return pinoHttp({
    logger,
    genReqId: (_req, res) => {
      const id = randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    autoLogging: opts.autoLogging,
    wrapSerializers: false,
    serializers: { req: requestForLog, res: responseForLog, err: stdSerializers.err },
  });
}
