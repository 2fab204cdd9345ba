import type { Request } from 'express';
import type { z } from 'zod';

/** Parse one part of a request with a shared zod schema; a ZodError becomes a 400 with per-field details. */
export const parseBody = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> => schema.parse(req.body ?? {});
export const parseQuery = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> => schema.parse(req.query ?? {});
export const parseParams = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> => schema.parse(req.params ?? {});
