import { setTimeout as sleep } from "node:timers/promises";
import type { Db } from "../../db/client";
import { ENGINE_VERSION } from "../../engine";
import { Unavailable } from "../../platform/errors";
import type {
  BaseBoundQuery,
  BaseBoundResponse,
  BoundProgress,
  SmallestBaseResponse,
} from "../../../shared/schemas/bounds";
import { SearchCancelled, SEARCH_TIMEOUT_MS, searchOffThread } from "./bounds.pool";
import {
  CLAIM_POLL_MS,
  CLAIM_REFRESH_MS,
  claim,
  dropClaim,
  findKept,
  keepAnswer,
  refreshClaim,
  type SearchKey,
} from "./bounds.repo";

export { SearchCancelled, SEARCH_TIMEOUT_MS };
export { activeBoundSearches, boundSearchEvents, boundSearchesStarted, warmBoundPool } from "./bounds.pool";

export interface SearchOptions {
  onProgress?: (p: BoundProgress) => void;
  signal?: AbortSignal;
}

/** One computation that several identical questions in this process wait on; aborted when the last one leaves. */
interface Shared {
  answer: Promise<SmallestBaseResponse>;
  stop: AbortController;
  listeners: Set<(p: BoundProgress) => void>;
  waiting: number;
}
// Per database handle, so two apps in one process (tests playing two instances) keep separate maps like two processes.
const inflightByDb = new WeakMap<Db, Map<string, Shared>>();

/**
 * Answers a base-bound query. Supported-length scans run in a pool thread. Smallest-base answers are kept in
 * PostgreSQL: a repeated question is a lookup, identical questions in flight share one computation in this process,
 * and a claim row makes other instances wait for that computation instead of repeating it.
 */
export async function runBaseBound(
  db: Db,
  query: BaseBoundQuery,
  opts: SearchOptions = {},
): Promise<BaseBoundResponse> {
  if (query.kind === "supportedLength") return searchOffThread(query, opts);
  if (opts.signal?.aborted) throw new SearchCancelled();
  const key: SearchKey = {
    engineVersion: ENGINE_VERSION,
    rotaryDim: query.rotaryDim,
    targetContext: query.targetContext,
    grid: query.grid,
  };
  const kept = await findKept(db, key);
  if (kept) return kept;
  // A caller that left during the lookup would never hear its "abort" event again: it must not join.
  if (opts.signal?.aborted) throw new SearchCancelled();

  let inflight = inflightByDb.get(db);
  if (!inflight) inflightByDb.set(db, (inflight = new Map()));
  const id = JSON.stringify(key);
  let shared = inflight.get(id);
  // A computation whose last waiter left is being torn down: a new question starts afresh.
  if (!shared || shared.stop.signal.aborted) {
    const created: Shared = { stop: new AbortController(), listeners: new Set(), waiting: 0, answer: undefined! };
    created.answer = computeOnce(db, query, key, created);
    created.answer.catch(() => undefined).finally(() => inflight.get(id) === created && inflight.delete(id));
    inflight.set(id, (shared = created));
  }
  return join(shared, opts);
}

function join(shared: Shared, opts: SearchOptions): Promise<SmallestBaseResponse> {
  shared.waiting++;
  if (opts.onProgress) shared.listeners.add(opts.onProgress);
  return new Promise((resolve, reject) => {
    let left = false;
    const leave = () => {
      if (left) return;
      left = true;
      opts.signal?.removeEventListener("abort", onAbort);
      if (opts.onProgress) shared.listeners.delete(opts.onProgress);
      if (--shared.waiting === 0) shared.stop.abort();
    };
    const onAbort = () => {
      leave();
      reject(new SearchCancelled());
    };
    opts.signal?.addEventListener("abort", onAbort, { once: true });
    shared.answer.then(
      (a) => {
        leave();
        resolve(a);
      },
      (e) => {
        leave();
        reject(e);
      },
    );
  });
}

async function computeOnce(
  db: Db,
  query: BaseBoundQuery,
  key: SearchKey,
  shared: Shared,
): Promise<SmallestBaseResponse> {
  const signal = shared.stop.signal;
  const deadline = Date.now() + SEARCH_TIMEOUT_MS;
  // runBaseBound has just looked for a kept answer, so the loop claims first and looks again only when the claim
  // fails: the row then exists, either kept meanwhile or claimed by another instance.
  for (;;) {
    if (signal.aborted) throw new SearchCancelled();
    if (await claim(db, key)) {
      const refresh = setInterval(() => void refreshClaim(db, key).catch(() => undefined), CLAIM_REFRESH_MS);
      try {
        const answer = (await searchOffThread(query, {
          signal,
          onProgress: (p) => shared.listeners.forEach((l) => l(p)),
        })) as SmallestBaseResponse;
        await keepAnswer(db, key, answer);
        return answer;
      } catch (e) {
        await dropClaim(db, key).catch(() => undefined);
        throw e;
      } finally {
        clearInterval(refresh);
      }
    }
    const kept = await findKept(db, key);
    if (kept) return kept;
    // Another instance is computing this key: look again shortly (its claim goes stale if it dies).
    if (Date.now() > deadline)
      throw new Unavailable("search_timeout", `the search took longer than ${SEARCH_TIMEOUT_MS / 1000} s`);
    await sleep(CLAIM_POLL_MS, undefined, { signal }).catch(() => undefined);
  }
}
