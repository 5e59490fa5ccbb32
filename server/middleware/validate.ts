import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { ValidationError } from '../lib/errors';

type Source = 'body' | 'query' | 'params';

export function formatZodError(error: z.ZodError): string {
  return error.issues.map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message)).join('; ');
}

// Parses one part of the request with a shared zod schema; the parsed value is
// stored on res.locals[source] (Express 5's req.query is read-only).
export function validate<S extends z.ZodType>(schema: S, source: Source = 'body'): RequestHandler {
  return (req, res, next) => {
    const parsed = schema.safeParse(req[source] ?? {});
    if (!parsed.success) {
      const fields = Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.') || '_', i.message]));
      throw new ValidationError(formatZodError(parsed.error), { fields });
    }
    res.locals[source] = parsed.data;
    next();
  };
}
