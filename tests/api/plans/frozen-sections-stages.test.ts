import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { makeTestApp, type Agent } from "../../setup/app";
import {
  CONTIGUOUS_SECTIONS,
  importSectionedModel,
  ntkThenLinearRevision,
  rewriteStoredContent,
  submittedPlan,
} from "../../setup/frozen-sections";
import { decide } from "../../setup/plans";

/*
 * Stage blocks of a revision signed before blocks carried multimodal sections (issue 11): each stage hands out its own
 * block (?stage=n), and the plan page lists every block the revision signed, so both say which block lacks the
 * sections the model reads on every step (huggingface/transformers src/transformers/models/qwen2_vl/
 * modeling_qwen2_vl.py at 00b676f8). The old revision is faked the way tests/api/plans/frozen-sections.test.ts fakes
 * one: the blocks engine 1.0 froze, written in review with their own valid hash.
 */
const { agentAs } = makeTestApp();
const exported = async (a: Agent, url: string) => exportEnvelopeSchema.parse((await a.get(url).expect(200)).body);

describe("stage blocks signed without the model's sections", () => {
  it("?stage=1 carries the caution naming that stage; the page's revision lists it; blocks with sections draw none", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await importSectionedModel(researcher, CONTIGUOUS_SECTIONS, "Stages");
    // Trained 32 768: stage 1 moves the base to 65 536 (NTK), stage 2 and the plan target stretch to 131 072 (s = 4).
    const { id, base } = await submittedPlan(researcher, modelId, ntkThenLinearRevision(), "Stage sections");

    // A new revision's every block carries the sections: nothing to say on the page.
    const fresh = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    expect(fresh.blockCautions).toEqual([]);

    // Engine 1.0 froze stage 1's new base as rope_scaling: null (methods/common.ts patchWithBase before 1.1); the
    // linear blocks are left with their sections, so only stage 1 lacks them.
    const { hash } = await rewriteStoredContent(id, (stored) => {
      const [s1, s2] = stored.results.stages;
      return {
        ...stored,
        engineVersion: "rw-engine/1.0.0",
        results: { ...stored.results, stages: [{ ...s1, patch: { ...s1.patch, rope_scaling: null } }, s2] },
      };
    });
    await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);

    const one = await exported(researcher, `/api/plans/${id}/approved/export?stage=1`);
    expect(one.contentHash).toBe(hash);
    expect(one.config.rope_scaling).toBeNull();
    expect(one.cautions).toHaveLength(1);
    expect(one.cautions![0].code).toBe("frozen_config_lacks_sections");
    expect(one.cautions![0].message).toContain('Stage 1\'s signed block lacks "mrope_section"');
    // the way out keeps the stage: its rigging for a stack, or a new revision
    // the stacks named are the targets whose rigging of stage 1 keeps the sections, asked of the targets themselves
    // (tests/unit/engine/targets/sections-keeping.test.ts): every transformers line, vLLM and SGLang (a new base is
    // plain RoPE there, which they build sectioned); not llama.cpp, whose architecture for this model runs no sections
    expect(one.cautions![0].message).toContain(
      "?stage=1&target=<stack> (transformers-v4-early, transformers-v4, transformers-v5, vllm, sglang)",
    );
    expect(one.cautions![0].message).toContain("draft a new revision");
    const rigged = await exported(researcher, `/api/plans/${id}/revisions/1/export?stage=1&target=transformers-v4`);
    expect(rigged.cautions?.map((c) => c.code)).toEqual(["frozen_config_lacks_sections"]);
    // stage 2 and the plan target kept theirs
    expect((await exported(researcher, `/api/plans/${id}/approved/export?stage=2`)).cautions).toBeUndefined();
    expect((await exported(researcher, `/api/plans/${id}/approved/export`)).cautions).toBeUndefined();

    // The plan page reads the revision: it names stage 1's block, with the export's own words.
    const page = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    expect(page.blockCautions).toEqual([{ stage: 1, ...one.cautions![0] }]);
  });
});
