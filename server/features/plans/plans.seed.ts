import { eq } from "drizzle-orm";
import type { AppDeps } from "../../deps";
import { accelerators, modelProfiles, plans } from "../../db/schema";
import {
  createPlanRequestSchema,
  type CreatePlanRequest,
  type MethodParams,
  type Role,
  type SessionUser,
} from "../../../shared/schemas";
import { createPlan as createPlanParsed, newRevision, updateDraft } from "./plans.service";
import { decide, submit } from "./workflow.service";
import { findRevision } from "./plans.repo";

type People = Map<string, number>;
const person = (people: People, email: string, name: string, roles: Role[]): SessionUser => ({
  id: people.get(email)!,
  email,
  name,
  roles,
});

/**
 * Demo plans of the Saltmarsh lab, one in every state, written and signed by the demo people through the same
 * services the API uses (so hashes, decisions, audit rows and mail are all real). Skipped when the titles exist.
 */
export async function seedPlans(deps: AppDeps, people: People) {
  const tomasz = person(people, "researcher@ropewalk.test", "Tomasz Brandt", ["researcher"]);
  const henrik = person(people, "approver@ropewalk.test", "Henrik Osei", ["approver"]);
  const mireille = person(people, "approver2@ropewalk.test", "Mireille Tanaka", ["approver"]);
  const model = async (name: string) =>
    (await deps.db.select().from(modelProfiles).where(eq(modelProfiles.name, name)).limit(1))[0];
  const [gannet, heron, albatross] = [
    await model("Gannet-8B"),
    await model("Heron-1.3B"),
    await model("Albatross-27B"),
  ];
  const [kittiwake] = await deps.db.select().from(accelerators).where(eq(accelerators.name, "Kittiwake K80")).limit(1);
  if (!gannet || !heron || !albatross || !kittiwake) return;
  const exists = async (title: string) =>
    (await deps.db.select({ id: plans.id }).from(plans).where(eq(plans.title, title)).limit(1)).length > 0;
  const budget = { cluster: { acceleratorId: kittiwake.id }, accelerators: 64, utilization: 0.4 };
  // Demo approvers sign the hash they would have read, as the review dialog sends it.
  const decideAsRead = async (
    who: SessionUser,
    planId: number,
    n: number,
    input: { decision: "approve" | "request_changes"; comment: string },
  ) => decide(deps, who, planId, n, { ...input, contentHash: (await findRevision(deps.db, planId, n))!.contentHash });
  const createPlan = (d: AppDeps, who: SessionUser, input: CreatePlanRequest) =>
    createPlanParsed(d, who, createPlanRequestSchema.parse(input));
  const stage = (
    targetContext: number,
    steps: number,
    globalBatch: number,
    method: MethodParams = { method: "yarn" },
  ) => ({
    targetContext,
    method,
    steps,
    globalBatch,
    sequenceLength: targetContext,
    learningRate: 2e-5,
    dataMix: "long books 50%, code 30%, chat 20%",
  });
  const acceptance = (len: number) => [
    {
      evaluation: "passkey retrieval",
      contextLength: len,
      metric: "accuracy",
      comparison: ">=" as const,
      threshold: 0.95,
    },
    {
      evaluation: "long-document QA",
      contextLength: len,
      metric: "F1 drop vs 8k",
      comparison: "<=" as const,
      threshold: 0.02,
    },
  ];

  const gannet128 = "Gannet-8B to 128k in two stages";
  if (!(await exists(gannet128))) {
    // Approved with two signatures; an earlier revision superseded.
    const p = await createPlan(deps, tomasz, {
      title: gannet128,
      purpose: "Long-document assistant for the lab's archive search.",
      modelId: gannet.id,
      requiredApprovals: 2,
      revision: {
        targetContext: 131072,
        method: { method: "yarn" },
        stages: [stage(65536, 400, 64), stage(131072, 200, 32)],
        acceptance: acceptance(131072),
        notes: "First try with linear interpolation was too blurry at short range.",
        budget,
      },
    });
    await submit(deps, tomasz, p.id, 1);
    await decideAsRead(henrik, p.id, 1, { decision: "approve", comment: "Stage lengths fine." });
    await decideAsRead(mireille, p.id, 1, { decision: "approve", comment: "" });
    const r2 = await newRevision(deps, tomasz, p.id);
    await updateDraft(deps, tomasz, p.id, r2.number, {
      version: r2.version,
      notes: "Raised stage 2 steps after the ablation.",
      stages: [stage(65536, 400, 64), stage(131072, 300, 32)],
    });
    await submit(deps, tomasz, p.id, r2.number);
    await decideAsRead(henrik, p.id, r2.number, {
      decision: "approve",
      comment: "More steps at 128k is the right call.",
    });
    await decideAsRead(mireille, p.id, r2.number, {
      decision: "approve",
      comment: "Budget within the quarter's allocation.",
    });
  }
  const heron16 = "Heron-1.3B to 16k for code review";
  if (!(await exists(heron16))) {
    const p = await createPlan(deps, tomasz, {
      title: heron16,
      purpose: "Whole-file code review on small hardware.",
      modelId: heron.id,
      requiredApprovals: 1,
      revision: {
        targetContext: 16384,
        method: { method: "linear" },
        stages: [stage(16384, 1000, 64, { method: "linear" })],
        acceptance: acceptance(16384),
        budget,
      },
    });
    await submit(deps, tomasz, p.id, 1);
    await decideAsRead(henrik, p.id, 1, {
      decision: "request_changes",
      comment: "Linear interpolation compresses every fast pair; try YaRN or llama3-style bands.",
    });
  }
  const albatross256 = "Albatross-27B to 256k with a larger base";
  if (!(await exists(albatross256))) {
    const p = await createPlan(deps, tomasz, {
      title: albatross256,
      purpose: "Contract analysis over full case files.",
      modelId: albatross.id,
      requiredApprovals: 2,
      revision: {
        targetContext: 262144,
        method: { method: "base", base: 50_000_000 },
        stages: [
          stage(65536, 500, 64, { method: "base", base: 10_000_000 }),
          stage(262144, 300, 16, { method: "base", base: 50_000_000 }),
        ],
        acceptance: acceptance(262144),
        budget: { ...budget, accelerators: 128 },
      },
    });
    await submit(deps, tomasz, p.id, 1);
    await decideAsRead(mireille, p.id, 1, { decision: "approve", comment: "One signature in; waiting for a second." });
  }
  const gannetDraft = "Gannet-8B to 1M (exploratory)";
  if (!(await exists(gannetDraft))) {
    await createPlan(deps, tomasz, {
      title: gannetDraft,
      purpose: "How far can the grouped-KV model stretch?",
      modelId: gannet.id,
      requiredApprovals: 2,
      revision: {
        targetContext: 1048576,
        method: { method: "llama3", factor: 128 },
        stages: [
          stage(131072, 300, 32, { method: "llama3", factor: 16 }),
          stage(1048576, 100, 4, { method: "llama3", factor: 128 }),
        ],
        notes: "Draft: KV cache at 1M is the open question.",
        budget,
      },
    });
  }
}
