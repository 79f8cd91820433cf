import { RateLimited } from "../../platform/errors";

/** Large analyses one user may have running at once; more answer 429 so one client cannot take every pool thread. */
export const HEAVY_ANALYSES_PER_USER = 2;
/** What Retry-After says: a large analysis takes well under this (`npm run bench`). */
export const HEAVY_RETRY_AFTER_SECONDS = 2;

const running = new Map<number, number>();

/** Takes one of the user's heavy-analysis slots or throws 429; call the returned function when done. */
export function takeHeavySlot(userId: number): () => void {
  const n = running.get(userId) ?? 0;
  if (n >= HEAVY_ANALYSES_PER_USER) {
    throw new RateLimited(
      `you already have ${n} large analyses running; wait for one to finish`,
      HEAVY_RETRY_AFTER_SECONDS,
      "too_many_analyses",
    );
  }
  running.set(userId, n + 1);
  let released = false;
  return () => {
    if (released) return;
    released = true;
    const left = (running.get(userId) ?? 1) - 1;
    if (left > 0) running.set(userId, left);
    else running.delete(userId);
  };
}
