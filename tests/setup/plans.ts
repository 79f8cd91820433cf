import type { Agent } from "./app";
import { sampleProfile } from "../fixtures/profiles";

/** A fresh profile (Gannet-like, 128-dim, base 10 000, trained 4096) created by the given editor. */
export async function createProfile(editor: Agent, over: Record<string, unknown> = {}) {
  const r = await editor.post("/api/models").set("X-CSRF-Token", editor.csrf).send(sampleProfile(over));
  if (r.status !== 201) throw new Error(`profile: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body.model as { id: number; name: string };
}

export const twoStageRevision = () => ({
  targetContext: 32768,
  method: { method: "yarn" as const },
  stages: [
    {
      targetContext: 16384,
      method: { method: "yarn" as const },
      steps: 200,
      globalBatch: 64,
      sequenceLength: 16384,
      learningRate: 2e-5,
      dataMix: "books 60%, code 40%",
    },
    {
      targetContext: 32768,
      method: { method: "yarn" as const },
      steps: 200,
      globalBatch: 32,
      sequenceLength: 32768,
      learningRate: 2e-5,
      dataMix: "books 60%, code 40%",
    },
  ],
  acceptance: [
    {
      evaluation: "passkey retrieval",
      contextLength: 32768,
      metric: "accuracy",
      comparison: ">=" as const,
      threshold: 0.95,
    },
  ],
  notes: "test plan",
});

/** Creates a plan (revision 1 draft) as the researcher; answers the plan detail. */
export async function createPlan(researcher: Agent, modelId: number, over: Record<string, unknown> = {}) {
  const r = await researcher
    .post("/api/plans")
    .set("X-CSRF-Token", researcher.csrf)
    .send({
      title: `Stretch ${Math.random().toString(36).slice(2, 7)}`,
      modelId,
      revision: twoStageRevision(),
      ...over,
    });
  if (r.status !== 201) throw new Error(`plan: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body as { id: number; revisions: { number: number; version: number; contentHash: string; state: string }[] };
}

export const post = (a: Agent, url: string, body: object = {}) => a.post(url).set("X-CSRF-Token", a.csrf).send(body);
export const put = (a: Agent, url: string, body: object = {}) => a.put(url).set("X-CSRF-Token", a.csrf).send(body);

/**
 * Posts a decision the way the review dialog does: it reads the revision first and sends the content hash it shows.
 * `decisionsUrl` is `/api/plans/:id/revisions/:n/decisions`. Like supertest, `.expect(status)` checks the answer.
 */
export function decide(a: Agent, decisionsUrl: string, body: { decision: string; comment?: string }) {
  const sent = a.get(decisionsUrl.replace(/\/decisions$/, "")).then((rev) =>
    post(a, decisionsUrl, {
      contentHash: typeof rev.body.contentHash === "string" ? rev.body.contentHash : "0".repeat(64),
      ...body,
    }),
  );
  const expectStatus = async (status: number) => {
    const r = await sent;
    if (r.status !== status) throw new Error(`expected ${status}, got ${r.status} ${JSON.stringify(r.body)}`);
    return r;
  };
  return Object.assign(sent, { expect: expectStatus });
}
