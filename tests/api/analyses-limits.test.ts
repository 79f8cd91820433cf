import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { analyse } from "../../server/engine";
import { offloadedAnalyses } from "../../server/features/analyses/analyses.pool";
import { HEAVY_ANALYSES_PER_USER, HEAVY_RETRY_AFTER_SECONDS } from "../../server/features/analyses/analyses.limits";
import { MAX_FACTOR_LIST, MAX_HEAD_DIM, MAX_METHODS } from "../../shared/schemas/analysis";

const { agentAs } = makeTestApp();
const post = (a: Agent, body: unknown) =>
  a
    .post("/api/analyses")
    .set("X-CSRF-Token", a.csrf)
    .send(body as object);

const longrope = (pairs: number) => ({
  method: "longrope",
  longFactor: Array(pairs).fill(1.5),
  shortFactor: Array(pairs).fill(1),
});
/** A large request within the limits: head dim 1024, eight methods, 512-entry factor lists. */
const heavy = {
  model: { headDim: MAX_HEAD_DIM, ropeTheta: 500_000, trainedContext: 8192 },
  targetContext: 131_072,
  methods: [
    longrope(MAX_FACTOR_LIST),
    { method: "yarn" },
    { method: "linear" },
    { method: "ntk" },
    { method: "dynamic" },
    { method: "llama3" },
    { method: "base", base: 5e6 },
    { method: "default" },
  ],
};

describe("POST /api/analyses is bounded", () => {
  it("refuses the oversized request (head dim 8192, 16 methods, 4096 factors) naming each field", async () => {
    const a = await agentAs(["viewer"]);
    const r = await post(a, {
      model: { headDim: 8192, ropeTheta: 10_000, trainedContext: 4096 },
      targetContext: 32_768,
      methods: Array.from({ length: 16 }, () => longrope(4096)),
    });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields)).toEqual(expect.arrayContaining(["model.headDim", "methods"]));
  });

  it.each([
    ["head dim above the limit", { ...heavy, model: { ...heavy.model, headDim: MAX_HEAD_DIM + 2 } }, "model.headDim"],
    [
      "more methods than the limit",
      { ...heavy, methods: Array(MAX_METHODS + 1).fill({ method: "linear" }) },
      "methods",
    ],
    [
      "a factor list longer than the limit",
      { ...heavy, methods: [longrope(MAX_FACTOR_LIST + 1)] },
      "methods.0.longFactor",
    ],
  ])("%s → 400 naming %s", async (_label, body, field) => {
    const r = await post(await agentAs(["viewer"]), body);
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(400);
    expect(r.body.error.fields).toHaveProperty(field);
  });

  it("computes a large analysis in a pool thread, with exactly the engine's answer; a small one stays inline", async () => {
    const a = await agentAs(["viewer"]);
    const before = offloadedAnalyses();
    const small = await post(a, {
      model: { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 },
      targetContext: 8192,
      methods: [{ method: "linear" }],
    });
    expect(small.status).toBe(200);
    expect(offloadedAnalyses()).toBe(before);

    const r = await post(a, heavy);
    expect(r.status).toBe(200);
    expect(offloadedAnalyses()).toBe(before + 1);
    // Identity between the two paths: the thread runs the same pure engine on the same validated input.
    expect(r.body).toEqual(JSON.parse(JSON.stringify(analyse(heavy as Parameters<typeof analyse>[0]))));
  }, 60_000);

  it(`caps concurrent large analyses per user at ${HEAVY_ANALYSES_PER_USER}: the rest get 429 with Retry-After; others are unaffected`, async () => {
    const [greedy, other] = await Promise.all([agentAs(["viewer"]), agentAs(["viewer"])]);
    // Each a different question: a question asked before is a lookup (kept answers), which no cap needs to hold back.
    const heavyAt = (i: number) => ({ ...heavy, targetContext: heavy.targetContext + 1024 * i });
    const burst = Array.from({ length: 6 }, (_, i) => post(greedy, heavyAt(i + 1)));
    const theirs = post(other, heavyAt(100));
    const answers = await Promise.all(burst);
    const refused = answers.filter((r) => r.status === 429);
    expect(answers.every((r) => r.status === 200 || r.status === 429)).toBe(true);
    expect(refused.length).toBeGreaterThan(0);
    expect(answers.filter((r) => r.status === 200).length).toBeGreaterThanOrEqual(HEAVY_ANALYSES_PER_USER);
    for (const r of refused) {
      expect(r.headers["retry-after"]).toBe(String(HEAVY_RETRY_AFTER_SECONDS));
      expect(r.body.error.code).toBe("too_many_analyses");
    }
    expect((await theirs).status).toBe(200);
    // slots are given back: the same user is served again once the burst is over
    expect((await post(greedy, heavyAt(200))).status).toBe(200);
  }, 120_000);

  it("a question asked again is answered from the kept answers: no second computation, the same body", async () => {
    const a = await agentAs(["viewer"]);
    const question = { ...heavy, targetContext: heavy.targetContext + 7 };
    const first = await post(a, question);
    const before = offloadedAnalyses();
    const again = await post(a, question);
    expect(again.status).toBe(200);
    expect(offloadedAnalyses()).toBe(before);
    expect(again.body).toEqual(first.body);
  }, 60_000);
});
