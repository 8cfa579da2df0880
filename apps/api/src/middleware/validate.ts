import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { validationFailed } from '../lib/errors';

interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/** Turn zod issues into `{ "body.email": ["…"] }`, reporting every field, not only the first. */
export function issuesToFields(part: string, error: z.ZodError, into: Record<string, string[]> = {}) {
  for (const issue of error.issues) {
    const key = [part, ...issue.path.map(String)].join('.');
    (into[key] ??= []).push(issue.message);
  }
  return into;
}

/** Paths of strings holding a NUL character, which PostgreSQL text cannot store. */
function nulPaths(value: unknown, at: string[], out: string[][] = []): string[][] {
  if (typeof value === 'string') {
    if (value.includes('\u0000')) out.push(at);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => nulPaths(v, [...at, String(i)], out));
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) nulPaths(v, [...at, k], out);
  }
  return out;
}

/**
 * Validate body, query and params; the parsed values replace the raw ones, so handlers only see
 * data that passed the schema (unknown keys stripped, strings trimmed, numbers coerced).
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const fields: Record<string, string[]> = {};
    const parsed: Record<string, unknown> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(part === 'body' ? (req.body ?? {}) : req[part]);
      if (result.success) {
        parsed[part] = result.data;
        for (const at of nulPaths(result.data, [part])) (fields[at.join('.')] ??= []).push('Remove the NUL character');
      } else issuesToFields(part, result.error, fields);
    }
    if (Object.keys(fields).length > 0) return next(validationFailed(fields));
    if ('body' in parsed) req.body = parsed.body;
    // Express 5 exposes query and params through getters; shadow them with the parsed values.
    for (const part of ['query', 'params'] as const) {
      if (part in parsed) Object.defineProperty(req, part, { value: parsed[part], writable: true, configurable: true });
    }
    next();
  };
}
