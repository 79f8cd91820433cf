import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema } from "../../../shared/schemas/plans";
import { ENGINE_VERSION } from "../../../server/engine";
import { TARGETS, applyMergePatch } from "../../../server/engine/targets";
import { hashContent } from "../../../server/features/plans/revision-content";
import { makeTestApp, type Agent } from "../../setup/app";
import { ownerTestDb } from "../../setup/db";
import {
  CONTIGUOUS_SECTIONS,
  fixtureBytes,
  importSectionedModel,
  rewriteStoredContent,
  submittedPlan,
} from "../../setup/frozen-sections";
import { decide, post } from "../../setup/plans";

/*
 * The signed block of a model with multimodal sections (issue 11): the export envelope's `config` keeps
 * `mrope_section`, which the model's attention reads on every step (huggingface/transformers
 * src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8), and names the plan's type under `type` too, since
 * the 4.x multimodal config classes copy `type` over `rope_type` (configuration_qwen2_vl.py at 4efabc6e). The fixture
 * is the hand-written contiguous config with the older `type: "mrope"` block.
 */
const { agentAs } = makeTestApp();
const fixtureConfig = () => JSON.parse(fixtureBytes(CONTIGUOUS_SECTIONS).toString()) as Record<string, unknown>;
const SECTIONS = [16, 24, 24];

const sectionedModel = (a: Agent) => importSectionedModel(a, CONTIGUOUS_SECTIONS, "Sections");

/** A plan with one method, sent to inspection; answers its id and revision path. */
const submitted = (researcher: Agent, modelId: number, method: Record<string, unknown>) =>
  submittedPlan(researcher, modelId, { targetContext: 131072, method }, "Sections");

const exported = async (a: Agent, url: string) => exportEnvelopeSchema.parse((await a.get(url).expect(200)).body);

describe("the signed block of a multimodal model carries its sections", () => {
  it("NTK and linear plans, approved: the envelope's config keeps mrope_section and names the plan's type", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await sectionedModel(researcher);
    const ntk = await submitted(researcher, modelId, { method: "ntk" });
    const linear = await submitted(researcher, modelId, { method: "linear" });
    for (const p of [ntk, linear]) await decide(approver, `${p.base}/decisions`, { decision: "approve" }).expect(200);

    // The workbench's comparison of the saved profile shows the same block (its export block).
    const wb = await post(researcher, "/api/analyses", {
      model: { modelId },
      targetContext: 131072,
      methods: [{ method: "ntk" }],
    }).expect(200);
    expect(wb.body.methods[0].ropeScaling.rope_scaling).toEqual({
      rope_type: "default",
      type: "default",
      mrope_section: SECTIONS,
    });

    const a = await exported(researcher, `/api/plans/${ntk.id}/approved/export`);
    expect(a.engineVersion).toBe(ENGINE_VERSION);
    // A new base: plain RoPE at b′, as a default block that still holds the sections (not rope_scaling: null).
    expect(a.config.rope_scaling).toEqual({ rope_type: "default", type: "default", mrope_section: SECTIONS });
    expect(a.config.rope_theta).toBeGreaterThan(1e6);
    expect(a.cautions).toBeUndefined();

    const b = await exported(researcher, `/api/plans/${linear.id}/approved/export`);
    // s = 131 072 / 32 768 = 4
    expect(b.config.rope_scaling).toMatchObject({ rope_type: "linear", type: "linear", factor: 4 });
    expect(b.config.rope_scaling).toMatchObject({ mrope_section: SECTIONS });
    expect(b.cautions).toBeUndefined();
    // Merged onto the model's own config (RFC 7396), the old `type: "mrope"` is overwritten by the plan's type, so
    // the 4.x config class copies "linear" into rope_type, and the 4.55+ rules read every pair divided by 4.
    const merged = applyMergePatch(fixtureConfig(), b.config) as { rope_scaling: Record<string, unknown> };
    expect(merged.rope_scaling).toMatchObject({ type: "linear", rope_type: "linear", mrope_section: SECTIONS });
    const empty = { kind: "config-merge-patch" as const, content: {}, text: "{}" };
    const reading = TARGETS["transformers-v4"].read(merged, empty, 131072);
    expect(reading.method).toBe("linear");
    // θ_0 = 1 for every base; linear divides it by the factor
    expect(reading.invFreq[0]).toBe(0.25);
  });

  it("a revision signed before blocks carried sections keeps its content and hash; its export says what is missing", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await sectionedModel(researcher);
    const { id, base } = await submitted(researcher, modelId, { method: "ntk" });
    // As a revision frozen by engine 1.0 was stored: the NTK block was `rope_scaling: null` (methods/common.ts
    // patchWithBase before 1.1). Written in review, with its own valid hash, so the approval below signs that hash.
    const { revisionId, hash } = await rewriteStoredContent(id, (stored) => ({
      ...stored,
      engineVersion: "rw-engine/1.0.0",
      results: {
        ...stored.results,
        final: { ...stored.results.final, patch: { ...stored.results.final.patch, rope_scaling: null } },
      },
    }));
    await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);

    const env = await exported(researcher, `/api/plans/${id}/approved/export`);
    expect(env.contentHash).toBe(hash);
    expect(env.config.rope_scaling).toBeNull();
    expect(env.cautions).toHaveLength(1);
    expect(env.cautions![0].code).toBe("frozen_config_lacks_sections");
    expect(env.cautions![0].message).toContain('"mrope_section"');
    expect(env.cautions![0].message).toContain("?target=");
    expect(env.cautions![0].message).toContain("draft a new revision");
    // the same caution on the numbered route; the per-stack rigging, merged onto the model's file, keeps the sections
    const t = await exported(researcher, `/api/plans/${id}/revisions/1/export?target=transformers-v4`);
    expect(t.cautions?.map((c) => c.code)).toEqual(["frozen_config_lacks_sections"]);
    const rigged = applyMergePatch(fixtureConfig(), t.target!.artifact!.content) as { rope_scaling: unknown };
    expect(rigged.rope_scaling).toMatchObject({ rope_type: "default", mrope_section: SECTIONS });
    // never rewritten: stored content and hash as signed, and the revision still verifies
    const after = await ownerTestDb().pool.query("SELECT content, content_hash FROM plan_revisions WHERE id = $1", [
      revisionId,
    ]);
    expect(after.rows[0].content_hash).toBe(hash);
    expect(hashContent(after.rows[0].content)).toBe(hash);
    expect((await researcher.get(`${base}/verify`).expect(200)).body).toMatchObject({ ok: true, storedHash: hash });
  });
});
