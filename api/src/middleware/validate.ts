import type { RequestHandler } from 'express';
import { z } from 'zod';
import { AppError } from '../errors.ts';

interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}

/** Parsed request parts, put on res.locals.input (Express 5's req.query is read-only). */
export interface ValidatedInput<P = any, Q = any, B = any> {
  params: P;
  query: Q;
  body: B;
}

/**
 * Validates params, query and body with zod schemas from shared/ and stores the parsed values in
 * `res.locals.input`. Any failure is one 400 listing every field: nothing reaches a service.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const fieldErrors: Record<string, string[]> = {};
    const out: Record<string, unknown> = { params: {}, query: {}, body: {}, ...(res.locals.input ?? {}) };
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      const raw = part === 'body' ? (req.body ?? {}) : req[part];
      if (!schema) continue;
      const r = schema.safeParse(raw);
      if (r.success) out[part] = r.data;
      else {
        const flat = z.flattenError(r.error);
        for (const [k, v] of Object.entries(flat.fieldErrors as Record<string, string[]>)) fieldErrors[`${part}.${k}`] = v;
        if (flat.formErrors.length) fieldErrors[part] = flat.formErrors;
      }
    }
    if (Object.keys(fieldErrors).length) {
      const first = Object.entries(fieldErrors)[0];
      return next(new AppError('validation_failed', `Check ${first[0].replace(/^(body|query|params)\.?/, '') || first[0]}: ${first[1][0]}`, { fieldErrors }));
    }
    res.locals.input = out;
    next();
  };
}
