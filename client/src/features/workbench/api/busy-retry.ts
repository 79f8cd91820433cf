import { isApiError } from "@/lib/api-client";

/**
 * The server runs a few bound searches at a time and answers 503 "busy" beyond that (bounds.service.ts); a search
 * just cancelled frees its worker a moment later. Ask again a few times, sooner than the app's default backoff.
 */
export const retryWhileBusy = (failures: number, error: Error) =>
  isApiError(error) && error.status === 503 && failures < 6;
export const busyDelay = (failures: number) => Math.min(250 * 2 ** failures, 4000);
