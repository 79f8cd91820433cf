import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { applyMergePatch } from "../../../server/engine/targets";
import { makeTestApp } from "../../setup/app";
import { fixtureBytes, importSectionedModel, LAYERED_SECTIONS } from "../../setup/frozen-sections";
import { decide, post } from "../../setup/plans";

/*
 * A model both layered and multimodal (issue 11): local-window layers with their own base (10 000, window 4096) beside
 * full-attention layers (base 1e6, trained 32 768) and one layer without position encoding, in a model with
 * multimodal sections [16, 24, 24]. The rotating layers read the sections on every step (huggingface/transformers
 * src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8, `self.rope_scaling["mrope_section"]`), and every
 * group's block is a patch of the one config.json, so each keeps them: applied to the model's file, no group's block may
 * delete them. The local group stays as trained (default RoPE over its own base: no factor, no base change).
 */
const { agentAs } = makeTestApp();
/** The sections left in the model's file once a block is merged onto it (RFC 7396, as a config patch is applied). */
const sectionsAfter = (patch: object) =>
  (
    applyMergePatch(JSON.parse(fixtureBytes(LAYERED_SECTIONS).toString()), patch) as {
      rope_scaling?: { mrope_section?: unknown } | null;
    }
  ).rope_scaling?.mrope_section;
const SECTIONS = [16, 24, 24];

describe("every layer group's signed block of a layered multimodal model carries the sections", () => {
  for (const method of ["ntk", "linear"] as const) {
    it(`${method}: content groups, envelope layerGroups and the v5 nesting keep mrope_section; local stays as trained`, async () => {
      const researcher = await agentAs(["researcher"]);
      const approver = await agentAs(["approver"]);
      const modelId = await importSectionedModel(researcher, LAYERED_SECTIONS, "WinSect");
      const created = await post(researcher, "/api/plans", {
        title: `Layered sections ${Math.random().toString(36).slice(2, 7)}`,
        modelId,
        revision: { targetContext: 131072, method: { method } },
      }).expect(201);
      const base = `/api/plans/${created.body.id}/revisions/1`;
      const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
      const groups = rev.content.results.groups!;
      expect(groups.map((g) => [g.kind, g.method, g.scaled])).toEqual([
        ["sliding_attention", "default", false],
        ["full_attention", method, true],
        ["no_rope", "none", false],
      ]);
      for (const g of groups) {
        expect(g.patch.rope_scaling, g.kind).toMatchObject({ mrope_section: SECTIONS });
        expect(sectionsAfter(g.patch), g.kind).toEqual(SECTIONS);
      }
      // As trained: plain RoPE over the group's own base, a default block holding only the sections (no factor).
      expect(groups[0].patch.rope_scaling).toEqual({ rope_type: "default", type: "default", mrope_section: SECTIONS });
      expect(groups[0].patch.rope_theta).toBeUndefined();
      // The scaled group is the plan's own block (the final one), sections and all.
      expect(groups[1].patch).toEqual(rev.content.results.final.patch);
      // No rotary positions: nothing to scale, but its block still holds the sections rather than deleting them.
      expect(groups[2].patch.rope_scaling).toEqual({ rope_type: "default", type: "default", mrope_section: SECTIONS });

      await post(researcher, `${base}/submit`).expect(200);
      await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
      const exp = exportEnvelopeSchema.parse(
        (await researcher.get(`/api/plans/${created.body.id}/approved/export`).expect(200)).body,
      );
      expect(exp.cautions).toBeUndefined();
      expect(exp.config.rope_scaling).toMatchObject({ mrope_section: SECTIONS });
      expect(exp.layerGroups!.map((g) => g.kind)).toEqual(["sliding_attention", "full_attention", "no_rope"]);
      for (const g of exp.layerGroups!) expect(sectionsAfter(g.config), g.kind).toEqual(SECTIONS);
      expect(exp.layerGroups!.find((g) => g.kind === "sliding_attention")).toMatchObject({
        method: "default",
        ropeTheta: 10_000,
        config: { rope_scaling: { rope_type: "default", type: "default", mrope_section: SECTIONS } },
      });
      // v5 nesting (configuration_utils.py standardize_rope_params, "Case 2"): each rotating layer type's entry keeps
      // them; no_rope layers are no layer type there (server/engine/layer-nesting.ts).
      expect(Object.keys(exp.ropeParametersByLayerType!).sort()).toEqual(["full_attention", "sliding_attention"]);
      expect(exp.ropeParametersByLayerType!.sliding_attention).toEqual({
        rope_type: "default",
        mrope_section: SECTIONS,
        rope_theta: 10_000,
      });
      expect(exp.ropeParametersByLayerType!.full_attention).toMatchObject({
        rope_type: method === "ntk" ? "default" : "linear",
        mrope_section: SECTIONS,
      });
    });
  }
});
