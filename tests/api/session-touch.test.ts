import { describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import type { SessionData } from "express-session";
import { testDb } from "../setup/db";
import { throttledPgStore, TOUCH_EVERY_MS } from "../../server/http/session-store";

const { pool, db } = testDb();

const sessionWith = (expires: Date) => ({ cookie: { expires, originalMaxAge: 3_600_000 } }) as unknown as SessionData;
/** The stored expiry as PostgreSQL prints it (the store writes to_timestamp(seconds), so whole seconds compare). */
const storedExpiry = async (sid: string) =>
  (await db.execute<{ e: string }>(sql`SELECT expire::text AS e FROM session WHERE sid = ${sid}`)).rows[0].e;

describe("throttled session touch", () => {
  it("answers at once and writes the expiry at most once per interval per session", async () => {
    let clock = 1_000_000;
    // Each background write reports when it has finished; a skipped touch never starts one (no fixed sleeps).
    let writes = 0;
    let wrote: () => void = () => undefined;
    const store = throttledPgStore(pool, {
      prune: false,
      now: () => clock,
      written: () => {
        writes++;
        wrote();
      },
    });
    const nextWrite = () => new Promise<void>((res) => (wrote = res));
    const sid = `touch-${Math.random().toString(36).slice(2)}`;
    const t0 = new Date(Date.UTC(2030, 0, 1));
    await new Promise<void>((res, rej) => store.set(sid, sessionWith(t0), (e) => (e ? rej(e) : res())));
    const initial = await storedExpiry(sid);
    const touch = (at: Date) => new Promise<void>((res) => store.touch(sid, sessionWith(at), () => res()));

    let done = nextWrite();
    await touch(new Date(t0.getTime() + 1000)); // first touch in this process: written
    await done;
    const first = await storedExpiry(sid);
    expect(first).not.toBe(initial);

    clock += TOUCH_EVERY_MS - 1; // within the interval: answered, not written
    await touch(new Date(t0.getTime() + 2000));
    expect(writes).toBe(1); // the touch answered without starting a write
    expect(await storedExpiry(sid)).toBe(first);

    clock += 1; // interval over: written again
    done = nextWrite();
    await touch(new Date(t0.getTime() + 3000));
    await done;
    expect(writes).toBe(2);
    expect(await storedExpiry(sid)).not.toBe(first);
  });
});
