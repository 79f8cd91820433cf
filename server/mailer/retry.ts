/** After this many failed attempts a row is marked failed and no longer retried. */
export const MAX_ATTEMPTS = 20;
/** Longest wait between two attempts. */
export const MAX_RETRY_DELAY_MS = 10 * 60_000;

/**
 * Wait before the next attempt, given the attempts made before the one that just failed:
 * base·2^attempts capped at ten minutes (exponential backoff, common practice, no source).
 */
export function retryDelayMs(baseMs: number, attemptsBefore: number): number {
  return Math.min(baseMs * 2 ** attemptsBefore, MAX_RETRY_DELAY_MS);
}
