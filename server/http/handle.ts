import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { fieldErrors } from '../../shared/schemas';
import { ValidationError } from './errors';
import { sendJson } from './send-json';

type Schemas = { body?: z.ZodType; params?: z.ZodType; query?: z.ZodType };
type Parsed<S extends Schemas> = {
  [K in keyof S]: S[K] extends z.ZodType ? z.infer<S[K]> : never;
};

/**
 * An answer that is already JSON text (built by PostgreSQL), sent as it is. `T` is the shape the
 * text stands for, so a route's answer keeps its type.
 */
export class JsonText<T = unknown> {
  declare readonly shape?: T;
  constructor(readonly text: string) {}
}

/**
 * Validation middleware and handler in one: parses `{ body, params, query }` once with the shared
 * zod schemas, hands the parsed values to the handler and sends what it returns as JSON.
 * A bad id in the path is a 404 (an unknown row), a bad body a 400 naming the fields.
 */
export function handle<S extends Schemas>(
  schemas: S,
  handler: (input: Parsed<S>, req: Request, res: Response) => Promise<unknown>,
  status = 200,
): RequestHandler {
  return async (req: Request, res: Response, next: NextFunction) => {
    try {
      const input: Record<string, unknown> = {};
      for (const part of ['params', 'query', 'body'] as const) {
        const schema = schemas[part];
        if (!schema) continue;
        const result = schema.safeParse(req[part] ?? {});
        if (!result.success) {
          if (part === 'params') {
            res.status(404).json({ error: { code: 'not_found', message: 'Not found' } });
            return;
          }
          throw new ValidationError(fieldErrors(result.error));
        }
        input[part] = result.data;
      }
      const body = await handler(input as Parsed<S>, req, res);
      if (res.headersSent) return;
      sendJson(req, res, status, body instanceof JsonText ? body.text : JSON.stringify(body ?? { ok: true }));
    } catch (error) {
      next(error);
    }
  };
}
