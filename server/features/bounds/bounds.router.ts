import { Router } from "express";
import type { AppDeps } from "../../deps";
import { requireAuth } from "../../http/auth";
import { HttpError } from "../../platform/errors";
import { parseBody } from "../../http/validate";
import { baseBoundRequestSchema } from "../../../shared/schemas/bounds";
import { runBaseBound, SearchCancelled } from "./bounds.service";

/** Mounted at /api/bounds. Searches run in a worker thread; the stream variant reports progress as server-sent events. */
export function boundsRouter(_deps: AppDeps) {
  const r = Router();
  r.use(requireAuth);

  r.post("/base", async (req, res) => {
    const query = parseBody(baseBoundRequestSchema, req);
    const abort = new AbortController();
    // As for the stream: the connection closing before we answered means nobody waits for the result.
    res.on("close", () => {
      if (!res.writableEnded) abort.abort();
    });
    try {
      res.json(await runBaseBound(query, { signal: abort.signal }));
    } catch (e) {
      if (e instanceof SearchCancelled) return;
      throw e;
    }
  });

  r.post("/base/stream", async (req, res) => {
    const query = parseBody(baseBoundRequestSchema, req);
    const abort = new AbortController();
    const pending = runBaseBound(query, {
      signal: abort.signal,
      onProgress: (p) => send("progress", p),
    });
    // 'close' before the end means the client went away: stop the worker
    res.on("close", () => {
      if (!res.writableEnded) abort.abort();
    });
    res.status(200).set({ "Content-Type": "text/event-stream", "Cache-Control": "no-cache, no-transform", "X-Accel-Buffering": "no" });
    res.flushHeaders();
    function send(event: string, data: unknown) {
      if (!res.writableEnded) res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    }
    try {
      send("result", await pending);
    } catch (e) {
      if (e instanceof SearchCancelled) return;
      const known = e instanceof HttpError;
      if (!known) console.error("[bounds] stream search failed:", e);
      send("error", { code: known ? e.code : "internal", message: known ? e.message : "the search failed on our side; it has been logged" });
    }
    res.end();
  });

  return r;
}
