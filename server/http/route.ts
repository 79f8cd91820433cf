import { Router, type NextFunction, type Request, type RequestHandler, type Response } from "express";
import { z } from "zod";
import type { AppDeps } from "../deps";
import type { Role, SessionUser } from "../../shared/schemas";
import { currentUser, requireAuth, requireRole } from "./auth";
import { parseOr400 } from "../platform/validate";
import { COMPRESS_FROM_BYTES, type PreparedJson } from "../platform/prepared-json";

export type Method = "get" | "post" | "put" | "patch" | "delete";

/** A response that is not JSON (HTML, a file, a stream, an empty 204): its media type is documented, not validated. */
export interface RawResponse {
  contentType: string | null;
  description: string;
}
export type ResponseSpec = z.ZodType | RawResponse;
export type Responses = { [status: number]: ResponseSpec };

/**
 * What a handler returns: a status the route declares, with a body its schema accepts (checked by the compiler), or
 * the same body already serialised (`prepared`, for answers served many times: server/platform/prepared-json.ts).
 */
export type Reply<R extends Responses> = {
  [S in keyof R & number]: R[S] extends z.ZodType
    ? { status: S; body: z.input<R[S]> } | { status: S; prepared: PreparedJson<z.input<R[S]>> }
    : { status: S; raw: string | null } | { status: S; streamed: true };
}[keyof R & number];

/** Returned when the client went away before the answer was ready (a cancelled search): nothing is sent. */
export const CLIENT_GONE: unique symbol = Symbol("client gone");
type Answer<R extends Responses> = Reply<R> | typeof CLIENT_GONE;

export interface RouteContext<P, Q, B> {
  deps: AppDeps;
  req: Request;
  res: Response;
  params: P;
  query: Q;
  body: B;
  /** The signed-in user; reading it on a route open to anyone throws 401 when nobody is signed in. */
  readonly user: SessionUser;
}

/** "public": anyone; "signed-in": any user; a role list: at least one of them (roles are explicit, admin implies none). */
export type Access = "public" | "signed-in" | readonly Role[];

export interface RouteSpec<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType, R extends Responses> {
  method: Method;
  /** Express path relative to the feature's prefix, e.g. "/:id/revisions/:n". */
  path: string;
  summary: string;
  access: Access;
  params?: P;
  query?: Q;
  body?: B;
  /** Documented request body the helper does not parse (multipart uploads). */
  form?: { contentType: string; schema: z.ZodType };
  responses: R;
  /** Extra middleware after the access check (rate limiters, uploads), built once per app. */
  middleware?: (deps: AppDeps) => RequestHandler[];
  handler: (
    ctx: RouteContext<z.output<P>, z.output<Q>, z.output<B>>,
  ) => Promise<Answer<NoInfer<R>>> | Answer<NoInfer<R>>;
}

type AnyReply =
  | { status: number; body: unknown }
  | { status: number; prepared: PreparedJson }
  | { status: number; raw: string | null }
  | { status: number; streamed: true };

/** A route with its types checked at definition and erased for the feature's list. */
export interface ApiRoute {
  method: Method;
  path: string;
  summary: string;
  access: Access;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  form?: { contentType: string; schema: z.ZodType };
  responses: Responses;
  middleware?: (deps: AppDeps) => RequestHandler[];
  handler: (
    ctx: RouteContext<unknown, unknown, unknown>,
  ) => Promise<AnyReply | typeof CLIENT_GONE> | AnyReply | typeof CLIENT_GONE;
}

export function route<
  R extends Responses,
  P extends z.ZodType = z.ZodUnknown,
  Q extends z.ZodType = z.ZodUnknown,
  B extends z.ZodType = z.ZodUnknown,
>(spec: RouteSpec<P, Q, B, R>): ApiRoute {
  return spec as unknown as ApiRoute;
}

/** One feature's routes under one prefix; `use` runs before each of them (e.g. cache headers). */
export interface ApiFeature {
  prefix: string;
  tag: string;
  use?: RequestHandler[];
  routes: ApiRoute[];
}

export const isRaw = (spec: ResponseSpec): spec is RawResponse => !(spec instanceof z.ZodType);

/** Thrown in tests (logged in development) when a handler's JSON does not match the route's declared schema. */
export class ResponseMismatch extends Error {
  constructor(where: string, issues: z.core.$ZodIssue[]) {
    super(
      `${where}: response does not match its schema: ${issues.map((i) => `${i.path.join(".") || "(body)"}: ${i.message}`).join("; ")}`,
    );
  }
}

function accessGuard(access: Access): RequestHandler[] {
  if (access === "public") return [];
  if (access === "signed-in") return [requireAuth];
  return [requireRole(...access)];
}

async function send(deps: AppDeps, def: ApiRoute, req: Request, res: Response, reply: AnyReply): Promise<void> {
  const spec = def.responses[reply.status];
  if (!spec) throw new Error(`${def.method} ${req.baseUrl}${def.path} answered undeclared status ${reply.status}`);
  if ("streamed" in reply) return;
  if ("raw" in reply) {
    res.status(reply.status);
    if (reply.raw === null) return void res.end();
    if (!isRaw(spec) || !spec.contentType) throw new Error(`${def.method} ${def.path}: raw body for a JSON response`);
    return void res.type(spec.contentType).send(reply.raw);
  }
  if (isRaw(spec)) throw new Error(`${def.method} ${def.path}: JSON body for a ${spec.contentType} response`);
  // Outside production every JSON answer is checked against its declared schema: tests fail on a mismatch,
  // development logs it and still answers, so a drifting contract shows up before a consumer trips on it.
  // (A prepared answer's value may be parsed back from its bytes: read only here.)
  if (deps.config.env !== "production") {
    const checked = spec.safeParse("prepared" in reply ? reply.prepared.value : reply.body);
    if (!checked.success) {
      const err = new ResponseMismatch(`${def.method.toUpperCase()} ${req.baseUrl}${def.path}`, checked.error.issues);
      if (deps.config.env === "test") throw err;
      console.error(`[contract] ${err.message}`);
    }
  }
  if ("prepared" in reply) return sendPrepared(req, res, reply.status, reply.prepared);
  res.status(reply.status).json(reply.body);
}

/**
 * Sends prepared JSON bytes, compressed as the `compression` middleware would (server/app.ts: same levels, same 1 kB
 * threshold, Vary: Accept-Encoding, nothing done under Cache-Control: no-transform) but from bytes compressed once.
 * The middleware leaves an answer that already carries Content-Encoding alone. Between encodings the client
 * weighs equally, the client's order decides (the middleware would prefer br; either is a valid choice).
 */
async function sendPrepared(req: Request, res: Response, status: number, prepared: PreparedJson) {
  res.status(status).vary("Accept-Encoding").type("json");
  let bytes = prepared.json;
  const encoding = req.acceptsEncodings("br", "gzip", "identity");
  if (
    (encoding === "br" || encoding === "gzip") &&
    bytes.length >= COMPRESS_FROM_BYTES &&
    !/\bno-transform\b/.test(String(res.getHeader("Cache-Control") ?? ""))
  ) {
    bytes = await prepared.encoded(encoding);
    res.setHeader("Content-Encoding", encoding);
  }
  res.setHeader("Content-Length", bytes.length);
  res.end(bytes);
}

/** Registers every route of the feature on a fresh Express router (the OpenAPI document reads the same list). */
export function mountFeature(feature: ApiFeature, deps: AppDeps): Router {
  const r = Router();
  for (const h of feature.use ?? []) r.use(h);
  for (const def of feature.routes) {
    const run = async (req: Request, res: Response, next: NextFunction) => {
      try {
        const params = def.params ? parseOr400(def.params, req.params, "path") : undefined;
        const query = def.query ? parseOr400(def.query, req.query, "query") : undefined;
        const body = def.body ? parseOr400(def.body, req.body ?? {}, "body") : undefined;
        const ctx: RouteContext<unknown, unknown, unknown> = {
          deps,
          req,
          res,
          params,
          query,
          body,
          get user() {
            return currentUser(res);
          },
        };
        const answer = await def.handler(ctx);
        if (answer !== CLIENT_GONE) await send(deps, def, req, res, answer);
      } catch (e) {
        next(e);
      }
    };
    r[def.method](def.path, ...accessGuard(def.access), ...(def.middleware?.(deps) ?? []), run);
  }
  return r;
}
