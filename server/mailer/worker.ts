import type { AppDeps } from "../deps";
import { DEFAULT_BATCH, deliverDueMail } from "./outbox";

/** Where the worker schedules its runs; tests pass a hand-driven one and step the worker tick by tick. */
export interface WorkerClock {
  setTimeout(run: () => void, ms: number): { unref(): unknown };
  clearTimeout(handle: { unref(): unknown } | undefined): void;
}
const realClock: WorkerClock = {
  setTimeout: (run, ms) => setTimeout(run, ms),
  clearTimeout: (handle) => clearTimeout(handle as NodeJS.Timeout | undefined),
};

export interface OutboxWorker {
  /** Stops polling and waits for a delivery in progress to finish. */
  stop(): Promise<void>;
}

/**
 * Polls the outbox every intervalMs. Runs never overlap (the next one is scheduled when the last ends);
 * a full batch sent without failures is followed at once by the next. Errors are logged, never thrown.
 */
export function startOutboxWorker(
  deps: Pick<AppDeps, "db" | "config">,
  intervalMs = 1000,
  clock = realClock,
): OutboxWorker {
  let stopped = false;
  let timer: { unref(): unknown } | undefined;
  let running: Promise<void> | undefined;
  // Log state changes only, so a mail server that stays down does not fill the log every second.
  let lastProblem = "";

  const report = (problem: string) => {
    if (problem === lastProblem) return;
    if (problem) console.error(`[mail] ${problem}`);
    else console.log("[mail] outbox delivery works again.");
    lastProblem = problem;
  };

  const tick = async (): Promise<boolean> => {
    try {
      const r = await deliverDueMail(deps);
      if (r.failed) report("some mail could not be sent; it stays in the outbox and is retried (see the Mail page)");
      else if (r.sent) report("");
      return r.sent >= DEFAULT_BATCH; // a full batch with no failure: more may be waiting
    } catch (e) {
      report(`outbox delivery failed: ${(e as Error).message}`);
      return false;
    }
  };

  const schedule = (ms: number) => {
    if (stopped) return;
    timer = clock.setTimeout(() => {
      running = tick().then((more) => {
        running = undefined;
        schedule(more ? 0 : intervalMs);
      });
    }, ms);
    timer.unref();
  };

  schedule(0);
  return {
    async stop() {
      stopped = true;
      clock.clearTimeout(timer);
      await running;
    },
  };
}
