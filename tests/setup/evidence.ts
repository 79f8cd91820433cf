import type { Agent } from "./app";
import type { Role } from "../../shared/schemas";
import { createPlan, createProfile, decide, post } from "./plans";

/** Provenance whose 4096- and 32768-token buckets are full length (minimum within the 5% tolerance). */
export const fullProvenance = (over: Record<string, unknown> = {}) => ({
  engine: "vllm",
  engineVersion: "0.6.3",
  tokenizer: "gannet-tokenizer",
  chatTemplate: "none",
  truncation: "left",
  generationBudget: 32,
  buckets: [
    { contextLength: 4096, meanTokens: 4090, minTokens: 4080 },
    { contextLength: 16384, meanTokens: 16300, minTokens: 16200 },
    { contextLength: 32768, meanTokens: 32600, minTokens: 32500 },
  ],
  ...over,
});

/**
 * A plan on the fixture profile (trained 4096) targeting 32768, with the given criteria, submitted by a researcher and
 * approved by an approver. Answers the agents, the plan id and the approved revision's fingerprint and content hash.
 */
export async function approvedPlanWith(agentAs: (roles: Role[]) => Promise<Agent>, acceptance: object[]) {
  const researcher = await agentAs(["researcher"]);
  const approver = await agentAs(["approver"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id, {
    revision: { targetContext: 32768, method: { method: "yarn", factor: 8 }, stages: [], acceptance, notes: "" },
  });
  await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
  await decide(approver, `/api/plans/${plan.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  const rev = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
  return {
    researcher,
    approver,
    planId: plan.id,
    fingerprint: rev.body.rotaryFingerprint as string,
    contentHash: rev.body.contentHash as string,
  };
}

export const criterion = (kind: string, contextLength: number, comparison: string, threshold: number, extra = {}) => ({
  evaluation: `${kind} at ${contextLength}`,
  contextLength,
  metric: kind,
  comparison,
  threshold,
  kind,
  ...extra,
});

/** Posts evidence as a pipeline would (multipart: file, kind, fingerprint, provenance). */
export function upload(
  a: Agent,
  planId: number,
  parts: { kind: string; fingerprint: string; provenance?: unknown; file?: string | Buffer; fileName?: string },
  n = 1,
) {
  const req = a
    .post(`/api/plans/${planId}/revisions/${n}/evidence`)
    .set("X-CSRF-Token", a.csrf)
    .field("kind", parts.kind)
    .field("fingerprint", parts.fingerprint)
    .field(
      "provenance",
      typeof parts.provenance === "string" ? parts.provenance : JSON.stringify(parts.provenance ?? fullProvenance()),
    );
  return parts.file === undefined
    ? req
    : req.attach("file", Buffer.from(parts.file), parts.fileName ?? `${parts.kind}.csv`);
}
