import { once } from "node:events";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { activeBoundSearches, boundSearchEvents } from "../../server/features/bounds/bounds.service";
import { inverseFrequencies } from "../../server/engine/frequencies";
import { gridBases, supportedLengthNaive } from "../../server/engine/base-bound";

const { agent, agentAs } = makeTestApp();
const post = (a: Agent, body: unknown) =>
  a
    .post("/api/bounds/base")
    .set("X-CSRF-Token", a.csrf)
    .send(body as object);

interface SseEvent {
  event: string;
  data: any;
}

/** Opens the stream and collects server-sent events as they arrive; `abort()` drops the connection. */
function openStream(a: Agent, body: object) {
  const events: SseEvent[] = [];
  const waiters: (() => void)[] = [];
  let buffer = "";
  // buffer(true) with a custom parser: chunks still reach the parser as they arrive; the request completes at the end
  const req = a
    .post("/api/bounds/base/stream")
    .set("X-CSRF-Token", a.csrf)
    .send(body)
    .buffer(true)
    .parse((res, cb) => {
      res.setEncoding("utf8");
      res.on("data", (chunk: string) => {
        buffer += chunk;
        let cut;
        while ((cut = buffer.indexOf("\n\n")) >= 0) {
          const block = buffer.slice(0, cut);
          buffer = buffer.slice(cut + 2);
          const event = /^event: (.*)$/m.exec(block)?.[1] ?? "message";
          const data = JSON.parse(/^data: (.*)$/m.exec(block)?.[1] ?? "null");
          events.push({ event, data });
          waiters.splice(0).forEach((w) => w());
        }
      });
      res.on("end", () => cb(null, events));
    });
  const finished = new Promise<{ status: number; type: string }>((resolve, reject) =>
    req.end((err, res) => (err ? reject(err) : resolve({ status: res.status, type: res.headers["content-type"] }))),
  );
  finished.catch(() => undefined); // an aborted stream rejects here by design; tests that abort never await it
  const until = async (pred: (e: SseEvent[]) => boolean, ms = 20_000) => {
    const deadline = Date.now() + ms;
    while (!pred(events)) {
      if (Date.now() > deadline)
        throw new Error(`stream: condition not met, events ${JSON.stringify(events.slice(-3))}`);
      await new Promise<void>((r) => {
        waiters.push(r);
        setTimeout(r, 50);
      });
    }
  };
  return { events, finished, until, abort: () => req.abort() };
}

describe("POST /api/bounds/base", () => {
  it("needs a signed-in user", async () => {
    expect((await post(await agent(), { rotaryDim: 128, base: 10_000 })).status).toBe(401);
  });

  it("supported length of b = 10 000 at d = 128 is 1707, and null when maxLength stops before it (Men et al. 2024; derived in docs/rotary-scaling.md)", async () => {
    const a = await agentAs(["viewer"]);
    expect((await post(a, { rotaryDim: 128, base: 10_000 })).body).toEqual({
      supportedLength: 1707,
      maxLength: 2 ** 24,
    });
    expect((await post(a, { rotaryDim: 128, base: 1_000_000, maxLength: 27_115 })).body).toEqual({
      supportedLength: null,
      maxLength: 27_115,
    });
  });

  it("smallest grid base for a target, checked against the plain definition on the neighbouring candidates", async () => {
    const a = await agentAs(["viewer"]);
    const grid = { from: 1e3, to: 1e7, perDecade: 100 };
    const r = await post(a, { rotaryDim: 64, targetContext: 5000, grid });
    expect(r.status).toBe(200);
    const bases = gridBases(grid);
    const found = bases.indexOf(r.body.smallestBase);
    expect(found).toBeGreaterThan(0);
    expect(r.body).toMatchObject({ candidatesExamined: found + 1, candidatesTotal: bases.length, grid });
    expect(supportedLengthNaive(inverseFrequencies(64, bases[found]), 5000)).toBeNull();
    for (const b of bases.slice(0, found)) expect(supportedLengthNaive(inverseFrequencies(64, b), 5000)).not.toBeNull();
  });

  it("keeps the event loop answering while a long search runs in its worker", async () => {
    const a = await agentAs(["viewer"]);
    let searchDone = false;
    const started = once(boundSearchEvents, "start");
    // d = 128 at 1 048 576 over the default grid: hundreds of milliseconds of work, plus the worker start
    const search = post(a, { rotaryDim: 128, targetContext: 1_048_576 }).then((r) => {
      searchDone = true;
      return r;
    });
    await started;
    const answeredDuring: boolean[] = [];
    for (let i = 0; i < 3; i++) {
      const r = await a
        .post("/api/analyses")
        .set("X-CSRF-Token", a.csrf)
        .send({
          model: { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 },
          targetContext: 8192,
          methods: [{ method: "linear" }],
        });
      expect(r.status).toBe(200);
      answeredDuring.push(!searchDone);
    }
    expect(answeredDuring).toEqual([true, true, true]);
    const result = await search;
    expect(result.status).toBe(200);
    expect(result.body.candidatesTotal).toBe(701);
    // the answer really supports the target (plain definition, Men et al. 2024)
    expect(supportedLengthNaive(inverseFrequencies(128, result.body.smallestBase), 1_048_576)).toBeNull();
  });

  describe("names the field of every bad input", () => {
    // The full table of bad bodies runs against the same schema in tests/unit/schemas/bounds-request.test.ts;
    // these two cases prove each endpoint answers that 400 with the field named.
    it("an odd rotary dimension is a 400 naming rotaryDim", async () => {
      const r = await post(await agentAs(["viewer"]), { rotaryDim: 127, base: 10_000 });
      expect(r.status, JSON.stringify(r.body)).toBe(400);
      expect(Object.keys(r.body.error.fields)).toContain("rotaryDim");
    });

    it("the stream endpoint validates before it starts streaming", async () => {
      const a = await agentAs(["viewer"]);
      const r = await a.post("/api/bounds/base/stream").set("X-CSRF-Token", a.csrf).send({ rotaryDim: 3, base: 10 });
      expect(r.status).toBe(400);
      expect(r.body.error.fields).toHaveProperty("rotaryDim");
    });
  });
});

describe("POST /api/bounds/base/stream", () => {
  it("streams progress events with candidatesExamined/total, then the result", async () => {
    const a = await agentAs(["viewer"]);
    // A target no other test asks for: a kept answer would come back without progress events.
    const s = openStream(a, { rotaryDim: 128, targetContext: 1_000_003 });
    const head = await s.finished;
    expect(head.status).toBe(200);
    expect(head.type).toMatch(/^text\/event-stream/);
    const progress = s.events.filter((e) => e.event === "progress");
    expect(progress.length).toBeGreaterThan(1);
    for (const p of progress) expect(p.data).toMatchObject({ candidatesExamined: expect.any(Number), total: 701 });
    const counts = progress.map((p) => p.data.candidatesExamined);
    expect([...counts].sort((x, y) => x - y)).toEqual(counts);
    expect(s.events.at(-1)!.event).toBe("result");
    expect(s.events.at(-1)!.data.candidatesExamined).toBeGreaterThanOrEqual(counts.at(-1));
  });

  it("terminates the worker when the client disconnects", async () => {
    const a = await agentAs(["viewer"]);
    // d = 256 up to 2^22 would run for many seconds
    const s = openStream(a, { rotaryDim: 256, targetContext: 4_194_304 });
    await s.until((e) => e.some((x) => x.event === "progress"));
    expect(activeBoundSearches()).toBe(1);
    const exited = once(boundSearchEvents, "exit");
    s.abort();
    // the worker thread's own "exit" event, not a clock: a worker left running would fail this test by its timeout
    await exited;
    expect(activeBoundSearches()).toBe(0);
    expect(s.events.some((e) => e.event === "result")).toBe(false);
  });
});

describe("POST /api/bounds/base when the client goes away", () => {
  it("terminates the worker: the active-search count falls back to zero", async () => {
    const a = await agentAs(["viewer"]);
    // d = 8192 up to 2^31 over 10 000 grid candidates: left alone, it would hold its worker until SEARCH_TIMEOUT_MS.
    const started = once(boundSearchEvents, "start");
    const req = post(a, { rotaryDim: 8192, targetContext: 2 ** 31, grid: { from: 1e3, to: 1e13, perDecade: 1000 } });
    req.end(() => undefined); // an aborted request never calls back
    await started;
    expect(activeBoundSearches()).toBe(1);
    const exited = once(boundSearchEvents, "exit");
    req.abort();
    // The worker's own "exit" event: it is gone long before the search could finish or time out on its own.
    await exited;
    expect(activeBoundSearches()).toBe(0);
  }, 60_000);
});

describe("more searches than workers", () => {
  it("queue for a worker instead of failing: six at once all answer, each with the plain scan's result", async () => {
    const a = await agentAs(["viewer"]);
    const bases = [10_000, 20_000, 40_000, 80_000, 160_000, 320_000];
    const answers = await Promise.all(bases.map((base) => post(a, { rotaryDim: 64, base, maxLength: 20_000 })));
    expect(answers.map((r) => r.status)).toEqual(bases.map(() => 200));
    answers.forEach((r, i) =>
      expect(r.body.supportedLength).toBe(supportedLengthNaive(inverseFrequencies(64, bases[i]), 20_000)),
    );
  });
});
