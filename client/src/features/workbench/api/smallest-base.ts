import { queryOptions } from "@tanstack/react-query";
import { z } from "zod";
import {
  boundProgressEventSchema,
  smallestBaseResponseSchema,
  type BoundProgress,
  type SmallestBaseResponse,
} from "@shared/schemas/bounds";
import { ApiError, apiClient } from "@/lib/api-client";
import { busyDelay, retryWhileBusy } from "./busy-retry";
import { apiPaths } from "@/config/paths";
import { workbenchKeys } from "./keys";
import { readServerEvents } from "./server-events";

const streamErrorSchema = z.object({ code: z.string(), message: z.string() });

/**
 * POST /api/bounds/base/stream for { rotaryDim, targetContext }: `progress` events while the grid is scanned,
 * then `result` or `error`. Aborting `signal` closes the stream, and the server stops its worker.
 */
export async function streamSmallestBase(
  query: { rotaryDim: number; targetContext: number },
  signal: AbortSignal,
  onProgress: (p: BoundProgress) => void,
): Promise<SmallestBaseResponse> {
  const res = await apiClient.openStream(apiPaths.baseBoundStream(), query, signal);
  if (!res.body) throw new ApiError(0, "no_stream", "The browser could not read the search's progress stream.");
  const outcome: { result?: SmallestBaseResponse; failure?: ApiError } = {};
  await readServerEvents(res.body, ({ event, data }) => {
    const json: unknown = JSON.parse(data);
    if (event === "progress") {
      const p = boundProgressEventSchema.safeParse(json);
      if (p.success) onProgress(p.data);
    } else if (event === "result") {
      outcome.result = smallestBaseResponseSchema.parse(json);
    } else if (event === "error") {
      const e = streamErrorSchema.safeParse(json);
      outcome.failure = new ApiError(
        500,
        e.success ? e.data.code : "stream_error",
        e.success ? e.data.message : "the search failed",
      );
    }
  });
  if (outcome.failure) throw outcome.failure;
  if (!outcome.result) throw new ApiError(0, "stream_ended", "The search stopped before giving an answer.");
  return outcome.result;
}

/** The search as a query: the key is the question, so it runs once per (d, target); cancelling aborts the stream. */
// onProgress only reports on the running search; it is not part of the question, so not of the key.
export const smallestBaseQuery = (rotaryDim: number, targetContext: number, onProgress: (p: BoundProgress) => void) =>
  // eslint-disable-next-line @tanstack/query/exhaustive-deps
  queryOptions({
    queryKey: workbenchKeys.smallestBase(rotaryDim, targetContext),
    queryFn: ({ signal }) => streamSmallestBase({ rotaryDim, targetContext }, signal, onProgress),
    staleTime: Infinity,
    retry: retryWhileBusy,
    retryDelay: busyDelay,
  });
