import { queryOptions } from "@tanstack/react-query";
import { supportedLengthResponseSchema, type SupportedLengthResponse } from "@shared/schemas/bounds";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { busyDelay, retryWhileBusy } from "./busy-retry";
import { workbenchKeys } from "./keys";

export type SupportedLength = SupportedLengthResponse & { base: number };

/**
 * The supported length (Men et al. 2024) of each base, asked one after another: every search takes a worker
 * thread on the server, and the smallest-base search may hold another.
 */
export const supportedLengthsQuery = (rotaryDim: number, bases: number[]) =>
  queryOptions({
    queryKey: workbenchKeys.supportedLengths(rotaryDim, bases),
    queryFn: async (): Promise<SupportedLength[]> => {
      const out: SupportedLength[] = [];
      for (const base of bases) {
        const r = await apiClient.send(
          "POST",
          apiPaths.baseBound(),
          { rotaryDim, base },
          supportedLengthResponseSchema,
        );
        out.push({ base, ...r });
      }
      return out;
    },
    staleTime: Infinity,
    retry: retryWhileBusy,
    retryDelay: busyDelay,
  });
