import { AppError } from "../../platform/errors";
import { route, CLIENT_GONE, type ApiFeature } from "../../http/route";
import { baseBoundRequestSchema, baseBoundResponseSchema } from "../../../shared/schemas/bounds";
import { runBaseBound, SearchCancelled } from "./bounds.service";

/** Mounted at /api/bounds. Searches run in a worker thread; the stream variant reports progress as server-sent events. */
export const boundsFeature: ApiFeature = {
  prefix: "/bounds",
  tag: "engine",
  routes: [
    route({
      method: "post",
      path: "/base",
      summary: "Supported length of a base, or smallest supporting base (worker thread)",
      access: "signed-in",
      body: baseBoundRequestSchema,
      responses: { 200: baseBoundResponseSchema },
      handler: async ({ deps, res, body }) => {
        const abort = new AbortController();
        // As for the stream: the connection closing before we answered means nobody waits for the result.
        res.on("close", () => {
          if (!res.writableEnded) abort.abort();
        });
        try {
          return { status: 200, body: await runBaseBound(deps.db, body, { signal: abort.signal }) };
        } catch (e) {
          if (e instanceof SearchCancelled) return CLIENT_GONE;
          throw e;
        }
      },
    }),
    route({
      method: "post",
      path: "/base/stream",
      summary: "Same search as server-sent events with progress",
      access: "signed-in",
      body: baseBoundRequestSchema,
      responses: {
        200: {
          contentType: "text/event-stream",
          description:
            "Events `progress` (boundProgressEventSchema), then one `result` (as POST /api/bounds/base) or `error` ({ code, message })",
        },
      },
      handler: async ({ deps, res, body }) => {
        const abort = new AbortController();
        const pending = runBaseBound(deps.db, body, { signal: abort.signal, onProgress: (p) => send("progress", p) });
        // 'close' before the end means the client went away: stop the worker
        res.on("close", () => {
          if (!res.writableEnded) abort.abort();
        });
        res.status(200).set({
          "Content-Type": "text/event-stream",
          "Cache-Control": "no-cache, no-transform",
          "X-Accel-Buffering": "no",
        });
        res.flushHeaders();
        function send(event: string, data: unknown) {
          if (!res.writableEnded) res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
        }
        try {
          send("result", await pending);
        } catch (e) {
          if (e instanceof SearchCancelled) return CLIENT_GONE;
          const known = e instanceof AppError;
          if (!known) console.error("[bounds] stream search failed:", e);
          send("error", {
            code: known ? e.code : "internal",
            message: known ? e.message : "the search failed on our side; it has been logged",
          });
        }
        res.end();
        return { status: 200, streamed: true };
      },
    }),
  ],
};
