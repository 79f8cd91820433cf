import type { Request } from "express";
import type { z } from "zod";
import { parseOr400 } from "../platform/validate";

/** Parse helpers used by thin routers: `const body = body(schema, req)`. */
export const parseBody = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> =>
  parseOr400(schema, req.body ?? {}, "body");
export const parseQuery = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> =>
  parseOr400(schema, req.query, "query");
export const parseParams = <S extends z.ZodType>(schema: S, req: Request): z.infer<S> =>
  parseOr400(schema, req.params, "path");
