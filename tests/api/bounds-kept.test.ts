import { once } from "node:events";
import { and, eq, isNull } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { testDb } from "../setup/db";
import { createDb } from "../../server/db/client";
import { baseSearchResults } from "../../server/db/schema";
import { ENGINE_VERSION } from "../../server/engine";
import { smallestSupportingBase } from "../../server/engine/base-search";
import {
  boundSearchEvents,
  boundSearchesStarted,
  runBaseBound,
  SearchCancelled,
} from "../../server/features/bounds/bounds.service";
import type { BaseBoundQuery } from "../../shared/schemas/bounds";

type SmallestBaseQuery = Extract<BaseBoundQuery, { kind: "smallestBase" }>;

const { agentAs } = makeTestApp();
const post = (a: Agent, body: object) => a.post("/api/bounds/base").set("X-CSRF-Token", a.csrf).send(body);

// Every test asks about its own grid (perDecade differs), so no test sees another's kept answer.
const query = (perDecade: number, targetContext = 40_000): SmallestBaseQuery => ({
  kind: "smallestBase",
  rotaryDim: 64,
  targetContext,
  grid: { from: 1e3, to: 1e9, perDecade },
});
const keptRows = (perDecade: number) =>
  testDb()
    .db.select()
    .from(baseSearchResults)
    .where(and(eq(baseSearchResults.engineVersion, ENGINE_VERSION), eq(baseSearchResults.gridPerDecade, perDecade)));

describe("kept smallest-base answers", () => {
  it("a repeated question is a lookup that returns what a fresh in-process computation returns", async () => {
    const a = await agentAs(["viewer"]);
    const q = query(31);
    const body = { rotaryDim: q.rotaryDim, targetContext: q.targetContext, grid: q.grid };
    const before = boundSearchesStarted();
    const first = await post(a, body);
    expect(first.status).toBe(200);
    expect(boundSearchesStarted()).toBe(before + 1);
    const again = await post(a, body);
    expect(again.status).toBe(200);
    expect(boundSearchesStarted()).toBe(before + 1); // nothing computed the second time
    // the engine called directly, outside the pool and the store
    const fresh = { ...smallestSupportingBase(q.rotaryDim, q.targetContext, q.grid), grid: q.grid };
    expect(first.body).toEqual(fresh);
    expect(again.body).toEqual(fresh);
    const rows = await keptRows(31);
    expect(rows).toHaveLength(1);
    expect(rows[0].answer).toEqual(fresh);
  });

  it("identical questions asked at once compute once and all get the answer", async () => {
    const a = await agentAs(["viewer"]);
    const q = query(32, 200_000);
    const body = { rotaryDim: q.rotaryDim, targetContext: q.targetContext, grid: q.grid };
    const before = boundSearchesStarted();
    const answers = await Promise.all(Array.from({ length: 5 }, () => post(a, body)));
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200]);
    for (const r of answers) expect(r.body).toEqual(answers[0].body);
    expect(boundSearchesStarted()).toBe(before + 1);
  });

  it("two instances on one database (separate pools and maps) compute once between them", async () => {
    const q = query(33, 300_000);
    const one = testDb().db;
    const other = createDb(process.env.TEST_DATABASE_URL!, 2);
    try {
      const before = boundSearchesStarted();
      const [x, y] = await Promise.all([runBaseBound(one, q), runBaseBound(other.db, q)]);
      expect(y).toEqual(x);
      expect(boundSearchesStarted()).toBe(before + 1);
    } finally {
      await other.pool.end();
    }
  });

  it("one caller leaving does not stop the computation another waits for; the last one leaving does", async () => {
    const q = query(34, 1_048_576);
    const leaving = new AbortController();
    const started = once(boundSearchEvents, "start");
    const left = runBaseBound(testDb().db, q, { signal: leaving.signal });
    const stays = runBaseBound(testDb().db, q);
    await started;
    leaving.abort();
    await expect(left).rejects.toBeInstanceOf(SearchCancelled);
    const answer = await stays;
    expect(answer).toEqual({ ...smallestSupportingBase(q.rotaryDim, q.targetContext, q.grid), grid: q.grid });

    // now a question whose only caller leaves: its claim is given up, nothing half-done is kept
    const lone = query(35, 1_048_576);
    const go = new AbortController();
    const loneStarted = once(boundSearchEvents, "start");
    const exited = once(boundSearchEvents, "exit");
    const pending = runBaseBound(testDb().db, lone, { signal: go.signal });
    await loneStarted;
    go.abort();
    await expect(pending).rejects.toBeInstanceOf(SearchCancelled);
    await exited;
    await expect.poll(async () => (await keptRows(35)).length).toBe(0);
  });

  it("a claim left by an instance that died is taken over", async () => {
    const q = query(36);
    await testDb()
      .db.insert(baseSearchResults)
      .values({
        engineVersion: ENGINE_VERSION,
        rotaryDim: q.rotaryDim,
        targetContext: q.targetContext,
        gridFrom: q.grid.from,
        gridTo: q.grid.to,
        gridPerDecade: q.grid.perDecade,
        claimedAt: new Date(Date.now() - 60_000),
      });
    const answer = await runBaseBound(testDb().db, q);
    expect(answer).toEqual({ ...smallestSupportingBase(q.rotaryDim, q.targetContext, q.grid), grid: q.grid });
    const claims = await testDb()
      .db.select()
      .from(baseSearchResults)
      .where(and(eq(baseSearchResults.gridPerDecade, 36), isNull(baseSearchResults.answer)));
    expect(claims).toHaveLength(0);
  });
});
