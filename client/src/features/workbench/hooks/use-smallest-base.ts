import { useCallback, useState } from "react";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import type { BoundProgress } from "@shared/schemas/bounds";
import { workbenchKeys } from "../api/keys";
import { smallestBaseQuery } from "../api/smallest-base";

/**
 * The smallest-base search for (d, target) with its live progress. It starts when the question is first asked;
 * `cancel` aborts the stream (the server stops its worker) and `restart` asks again.
 */
export function useSmallestBase(rotaryDim: number, targetContext: number) {
  const queryClient = useQueryClient();
  const key = `${rotaryDim}:${targetContext}`;
  const [progress, setProgress] = useState<{ key: string; value: BoundProgress } | null>(null);
  const onProgress = useCallback((value: BoundProgress) => setProgress({ key, value }), [key]);
  const query = useQuery(smallestBaseQuery(rotaryDim, targetContext, onProgress));
  return {
    query,
    progress: progress?.key === key ? progress.value : null,
    /** Pending with nothing fetching: the search was cancelled before it answered. */
    cancelled: query.isPending && query.fetchStatus === "idle",
    cancel: () => queryClient.cancelQueries({ queryKey: workbenchKeys.smallestBase(rotaryDim, targetContext) }),
    restart: () => {
      setProgress(null);
      void query.refetch();
    },
  };
}
