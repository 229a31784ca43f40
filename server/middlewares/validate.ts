import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { z, ZodType } from 'zod';
import { errors } from '../errors';

interface Schemas {
  body?: ZodType;
  query?: ZodType;
  params?: ZodType;
}

export type Parsed<S extends Schemas> = {
  body: S['body'] extends ZodType ? z.output<S['body']> : undefined;
  query: S['query'] extends ZodType ? z.output<S['query']> : undefined;
  params: S['params'] extends ZodType ? z.output<S['params']> : undefined;
};

/** Turns zod issues into `{ "path.to.field": "message" }`, first message per field. */
export function fieldsFromZod(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** One validate step: parses body, query and params and stores the result on req.input. */
export function validate<S extends Schemas>(schemas: S): RequestHandler {
  return (req: Request, _res: Response, next: NextFunction) => {
    const fields: Record<string, string> = {};
    const input: Record<string, unknown> = { body: undefined, query: undefined, params: undefined };
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const raw: unknown = part === 'body' ? (req.body ?? {}) : req[part];
      const result = schema.safeParse(raw);
      if (result.success) input[part] = result.data;
      else Object.assign(fields, fieldsFromZod(result.error));
    }
    if (Object.keys(fields).length > 0) {
      const first = Object.entries(fields)[0];
      const message = first ? `${first[0]}: ${first[1]}` : 'Check the highlighted fields.';
      next(errors.validation(message, fields));
      return;
    }
    req.input = input as Request['input'];
    next();
  };
}

/** Reads the parsed input of a route validated with `schemas` (typed). */
export function inputOf<S extends Schemas>(req: Request, _schemas: S): Parsed<S> {
  return req.input as Parsed<S>;
}
