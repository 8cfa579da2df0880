import type { Request, Response } from 'express';

const serialised = new WeakMap<object, { body: string; etag: string | undefined }>();

/**
 * `res.json(value)` for a value that may be sent many times as it is — a page served from the
 * library cache is the same object on every hit — serialised and tagged once per object instead
 * of on every send. The value must not be changed after it is first sent (cached values never are).
 */
export function sendJsonOnce(req: Request, res: Response, value: object): void {
  let s = serialised.get(value);
  if (!s) {
    const body = JSON.stringify(value);
    const etagOf = req.app.get('etag fn') as ((body: string, encoding: string) => string) | undefined;
    s = { body, etag: etagOf?.(body, 'utf8') };
    serialised.set(value, s);
  }
  // res.send computes no ETag of its own when one is set
  if (s.etag) res.setHeader('ETag', s.etag);
  res.type('json').send(s.body);
}
