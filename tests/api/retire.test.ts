import { describe, expect, it } from "vitest";
import { ROLES } from "../../shared/schemas";
import { acceleratorListResponseSchema } from "../../shared/schemas/budget";
import { modelsListResponseSchema } from "../../shared/schemas/models";
import { makeTestApp, type Agent } from "../setup/app";
import { testDb } from "../setup/db";
import { createPlan, createProfile, post, put } from "../setup/plans";

/*
 * Referenced things stay usable: an accelerator a plan was costed on, or a profile a plan uses, is retired instead of
 * deleted. Before this, deleting the accelerator left the plan unable to start a new revision (400 naming
 * budget.cluster.acceleratorId), and deleting the profile answered 409.
 */
const { agentAs } = makeTestApp();
const uniq = () => Math.random().toString(36).slice(2, 8);
const accelerator = () => ({
  name: `Hawser-${uniq()}`,
  memoryBytes: 80e9,
  peakFlops: 1e15,
  pricePerHour: 2,
  notes: "test",
});
const auditOf = async (subjectType: string, id: number) =>
  (
    await testDb().pool.query(
      "SELECT action FROM audit_events WHERE subject_type = $1 AND subject_id = $2 ORDER BY id",
      [subjectType, String(id)],
    )
  ).rows.map((r) => r.action as string);

/** A decision that moves the revision out of review; sends the hash it read when the contract asks for one. */
async function requestChanges(approver: Agent, researcher: Agent, base: string) {
  const hash = (await researcher.get(base).expect(200)).body.contentHash as string;
  let r = await post(approver, `${base}/decisions`, { decision: "request_changes", comment: "another accelerator" });
  if (r.status === 400 && r.body.error?.fields?.contentHash)
    r = await post(approver, `${base}/decisions`, {
      decision: "request_changes",
      comment: "another accelerator",
      contentHash: hash,
    });
  expect(r.status).toBe(200);
}

/** A plan costed on a fresh accelerator, submitted and sent back, so its owner may start revision 2. */
async function planCostedOn() {
  const infra = await agentAs(["infra"]);
  const acc = (await post(infra, "/api/accelerators", accelerator()).expect(201)).body.accelerator as {
    id: number;
    name: string;
  };
  const researcher = await agentAs(["researcher"]);
  const plan = await createPlan(researcher, (await createProfile(researcher)).id);
  const base = `/api/plans/${plan.id}/revisions/1`;
  await put(researcher, base, { version: 1, budget: { cluster: { acceleratorId: acc.id }, accelerators: 64 } }).expect(
    200,
  );
  await post(researcher, `${base}/submit`).expect(200);
  await requestChanges(await agentAs(["approver"]), researcher, base);
  return { infra, researcher, acc, plan, base };
}

describe("retiring an accelerator that plans were costed on", () => {
  it("delete retires it: hidden as retired, frozen figures kept, a new draft names it and submitting asks for another", async () => {
    const { infra, researcher, acc, plan, base } = await planCostedOn();
    const frozen = (await researcher.get(base).expect(200)).body;

    const del = await infra.delete(`/api/accelerators/${acc.id}`).set("X-CSRF-Token", infra.csrf);
    expect(del.status).toBe(200);
    expect(del.body).toMatchObject({ retired: true, accelerator: { id: acc.id }, usedBy: [{ id: plan.id }] });
    expect(del.body.accelerator.retiredAt).toEqual(expect.any(String));
    const list = acceleratorListResponseSchema.parse((await researcher.get("/api/accelerators").expect(200)).body);
    expect(list.accelerators.find((a) => a.id === acc.id)?.retiredAt).toEqual(expect.any(String));
    expect(await auditOf("accelerator", acc.id)).toEqual(["accelerator.created", "accelerator.retired"]);

    // The sent-back revision keeps its figures and still verifies.
    const after = (await researcher.get(base).expect(200)).body;
    expect(after.contentHash).toBe(frozen.contentHash);
    expect(after.content.budget).toEqual(frozen.content.budget);
    expect((await researcher.get(`${base}/verify`)).body.ok).toBe(true);

    // Before the fix this answered 400 naming budget.cluster.acceleratorId.
    const next = await post(researcher, `/api/plans/${plan.id}/revisions`);
    expect(next.status).toBe(201);
    const draftUrl = `/api/plans/${plan.id}/revisions/2`;
    const draft = (await researcher.get(draftUrl).expect(200)).body;
    expect(draft.content.budget.cluster.name).toBe(acc.name);
    expect(draft.content.budget.inputs.cluster.acceleratorId).toBe(acc.id);
    // Editing anything else still saves; submitting on the retired accelerator asks for another, and writes nothing.
    const edited = await put(researcher, draftUrl, { version: draft.version, notes: "second try" }).expect(200);
    const refused = await post(researcher, `${draftUrl}/submit`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.fields["budget.cluster.acceleratorId"]).toMatch(/retired/);
    expect((await researcher.get(draftUrl).expect(200)).body.state).toBe("draft");

    // Picking a live accelerator lets it go through.
    const other = (await post(infra, "/api/accelerators", accelerator()).expect(201)).body.accelerator as {
      id: number;
    };
    await put(researcher, draftUrl, {
      version: edited.body.version,
      budget: { cluster: { acceleratorId: other.id }, accelerators: 64 },
    }).expect(200);
    await post(researcher, `${draftUrl}/submit`).expect(200);
  });

  it("a retired accelerator is refused as a new choice, but the estimator still costs on it", async () => {
    const { infra, researcher, acc } = await planCostedOn();
    await infra.delete(`/api/accelerators/${acc.id}`).set("X-CSRF-Token", infra.csrf).expect(200);
    const model = await createProfile(researcher);
    const fresh = await post(researcher, "/api/plans", {
      title: `Fresh ${uniq()}`,
      modelId: model.id,
      revision: {
        targetContext: 32768,
        method: { method: "yarn" },
        stages: [
          {
            targetContext: 32768,
            method: { method: "yarn" },
            steps: 100,
            globalBatch: 32,
            sequenceLength: 32768,
            learningRate: 2e-5,
            dataMix: "books",
          },
        ],
        acceptance: [],
        notes: "",
        budget: { cluster: { acceleratorId: acc.id }, accelerators: 8 },
      },
    });
    expect(fresh.status).toBe(400);
    expect(fresh.body.error.fields["budget.cluster.acceleratorId"]).toMatch(/retired/);
    // An estimator link to it still loads, on its last catalog numbers.
    const est = await post(researcher, "/api/budgets/estimate", {
      model: { modelId: model.id },
      cluster: { acceleratorId: acc.id },
      accelerators: 8,
      stages: [{ sequenceLength: 8192, globalBatch: 8, steps: 10 }],
    });
    expect(est.status).toBe(200);
    expect(est.body.resolved).toMatchObject({
      acceleratorName: acc.name,
      cluster: { peakFlops: 1e15, pricePerHour: 2 },
    });
  });

  it("restore offers it again; an unused accelerator is still deleted", async () => {
    const { infra, acc } = await planCostedOn();
    await post(infra, `/api/accelerators/${acc.id}/retire`).expect(200);
    expect((await post(infra, `/api/accelerators/${acc.id}/retire`)).status).toBe(409);
    const back = await post(infra, `/api/accelerators/${acc.id}/restore`).expect(200);
    expect(back.body.accelerator.retiredAt).toBeNull();
    expect(await auditOf("accelerator", acc.id)).toEqual([
      "accelerator.created",
      "accelerator.retired",
      "accelerator.restored",
    ]);
    const unused = (await post(infra, "/api/accelerators", accelerator()).expect(201)).body.accelerator as {
      id: number;
    };
    await infra.delete(`/api/accelerators/${unused.id}`).set("X-CSRF-Token", infra.csrf).expect(204);
    expect((await testDb().pool.query("SELECT 1 FROM accelerators WHERE id = $1", [unused.id])).rowCount).toBe(0);
    expect((await post(infra, "/api/accelerators/99999999/retire")).status).toBe(404);
  });

  for (const role of ROLES) {
    const may = role === "infra" || role === "admin";
    it(`${role} ${may ? "may" : "may not"} retire and restore accelerators`, async () => {
      const infra = await agentAs(["infra"]);
      const acc = (await post(infra, "/api/accelerators", accelerator()).expect(201)).body.accelerator as {
        id: number;
      };
      const a = await agentAs([role]);
      expect((await post(a, `/api/accelerators/${acc.id}/retire`)).status).toBe(may ? 200 : 403);
      if (!may) await post(infra, `/api/accelerators/${acc.id}/retire`).expect(200);
      expect((await post(a, `/api/accelerators/${acc.id}/restore`)).status).toBe(may ? 200 : 403);
    });
  }
});

describe("retiring a model profile that plans use", () => {
  it("delete retires it (it was a 409); the plan keeps working; a new plan on it is refused; restore brings it back", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const del = await researcher.delete(`/api/models/${model.id}`).set("X-CSRF-Token", researcher.csrf);
    expect(del.status).toBe(200);
    expect(del.body).toMatchObject({ retired: true, model: { id: model.id }, usedBy: [{ id: plan.id }] });
    const list = modelsListResponseSchema.parse(
      (await researcher.get(`/api/models?q=${encodeURIComponent(model.name)}`).expect(200)).body,
    );
    expect(list.models.find((m) => m.id === model.id)?.retiredAt).toEqual(expect.any(String));
    expect(await auditOf("model", model.id)).toEqual(["model.created", "model.retired"]);

    // The plan keeps working: it reads, edits, submits, and its profile still reads.
    const base = `/api/plans/${plan.id}/revisions/1`;
    expect((await researcher.get(`/api/plans/${plan.id}`).expect(200)).body.model).toMatchObject({ id: model.id });
    await put(researcher, base, { version: 1, notes: "still fine" }).expect(200);
    await post(researcher, `${base}/submit`).expect(200);
    await researcher.get(`/api/models/${model.id}`).expect(200);

    const fresh = await post(researcher, "/api/plans", {
      title: `On retired ${uniq()}`,
      modelId: model.id,
      revision: {
        targetContext: 32768,
        method: { method: "yarn" },
        stages: [],
        acceptance: [],
        notes: "",
      },
    });
    expect(fresh.status).toBe(400);
    expect(fresh.body.error.fields.modelId).toBe("retired");

    const back = await post(researcher, `/api/models/${model.id}/restore`).expect(200);
    expect(back.body.model.retiredAt).toBeNull();
    expect(await auditOf("model", model.id)).toEqual(["model.created", "model.retired", "model.restored"]);
  });

  for (const role of ROLES) {
    const may = role === "researcher" || role === "infra" || role === "admin";
    it(`${role} ${may ? "may" : "may not"} retire profiles`, async () => {
      const editor = await agentAs(["researcher"]);
      const model = await createProfile(editor);
      const a = await agentAs([role]);
      expect((await post(a, `/api/models/${model.id}/retire`)).status).toBe(may ? 200 : 403);
      expect((await post(a, `/api/models/${model.id}/restore`)).status).toBe(may ? 200 : 403);
    });
  }
});
