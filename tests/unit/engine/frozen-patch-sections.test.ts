import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { analyse } from "../../../server/engine";
import { TARGETS, applyMergePatch, type TargetId } from "../../../server/engine/targets";
import { METHOD_CATALOG, METHOD_IDS } from "../../../shared/methods";
import type { ConfigPatch, MethodParams, ModelShape } from "../../../shared/schemas/analysis";

/*
 * The identity a revision's frozen config patch (`results.final.patch`, handed out by the export routes as `config`)
 * must meet for a model with multimodal sections: laid on the model's own config.json, it is read back by a
 * transformers line as the very frequencies and attention factor the plan analysed, and the sections survive (the
 * model's attention reads `rope_scaling["mrope_section"]` on every step: huggingface/transformers
 * src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8, Qwen2VLAttention.forward).
 *
 * Two ways a consumer applies the patch: as an RFC 7396 merge patch (server/engine/targets/merge-patch.ts), or by
 * replacing each top-level key it names, `rope_scaling` whole. The readers are our models of the 4.55+ rules
 * (hf/read-v4.ts, with the multimodal config class's `type` rule) and of the v5 line (hf/read-v5.ts).
 * The fixtures are the hand-written multimodal configs of tests/unit/engine/targets/mrope-sections.test.ts: the older
 * `type: "mrope"` layout (contiguous sections) and the `rope_type: "default"` layout (interleaved sections).
 */
const config = (n: string) =>
  JSON.parse(fs.readFileSync(path.join(import.meta.dirname, "../../fixtures/configs", n), "utf8")) as Record<
    string,
    unknown
  >;

const CASES = [
  {
    file: "mrope-sections-contiguous.json",
    // hidden_size 3584 / 28 heads = 128; rope_theta 1e6; max_position_embeddings 32768
    model: { headDim: 128, ropeTheta: 1e6, trainedContext: 32768, mropeSection: [16, 24, 24] },
    target: 131072,
    keys: { mrope_section: [16, 24, 24] },
  },
  {
    file: "mrope-sections-interleaved-bad-sum.json",
    model: {
      headDim: 128,
      ropeTheta: 5e6,
      trainedContext: 262144,
      mropeSection: [24, 20, 16],
      mropeInterleaved: true,
    },
    target: 1048576,
    keys: { mrope_section: [24, 20, 16], mrope_interleaved: true },
  },
] satisfies { file: string; model: ModelShape; target: number; keys: Record<string, unknown> }[];

const methodsFor = (pairs: number): MethodParams[] =>
  METHOD_IDS.map((id) =>
    id === "longrope" ? METHOD_CATALOG.longrope.example(pairs) : (METHOD_CATALOG[id].example(pairs) as MethodParams),
  );

const READERS: TargetId[] = ["transformers-v4", "transformers-v5"];

/*
 * 4.x reads longrope's original length only from a top-level `original_max_position_embeddings` (hf/read-v4.ts; the
 * frozen block names it inside the block), so that pair never met the identity, sections or not: the per-stack
 * export (`?target=transformers-v4`) is the one that does (tests/unit/engine/targets/defects.test.ts, issue 10).
 */
const knownApart = (id: TargetId, method: MethodParams["method"]) => id === "transformers-v4" && method === "longrope";

const relative = (read: number, plan: number) => (read === plan ? 0 : Math.abs(read - plan) / Math.abs(plan));

/** The config a consumer runs after applying the patch: merged (RFC 7396) or with each named key replaced whole. */
function applied(cfg: Record<string, unknown>, patch: ConfigPatch, how: "merged" | "replaced") {
  return how === "merged" ? (applyMergePatch(cfg, patch) as Record<string, unknown>) : { ...cfg, ...patch };
}

describe("the frozen config patch of a multimodal model reads back as the plan, sections kept", () => {
  for (const { file, model, target, keys } of CASES) {
    const pairs = model.headDim / 2;
    for (const method of methodsFor(pairs)) {
      for (const id of READERS) {
        for (const how of ["merged", "replaced"] as const) {
          const name = `${file} × ${method.method} × ${id} × ${how}`;
          it(name, () => {
            const cfg = config(file);
            const m = analyse({ model, targetContext: target, methods: [method] }).methods[0];
            const patch = m.ropeScaling;
            const after = applied(cfg, patch, how);
            // the sections survive in the block the 4.x layout reads them from
            expect(after.rope_scaling).toMatchObject(keys);
            if (knownApart(id, method.method)) return;
            const empty = { kind: "config-merge-patch" as const, content: {}, text: "{}" };
            const reading = TARGETS[id].read(after, empty, target);
            expect(reading.invFreq).toHaveLength(pairs);
            let worst = relative(reading.attentionFactor, m.attentionFactor);
            m.pairs.forEach((p, i) => (worst = Math.max(worst, relative(reading.invFreq[i], p.scaledInvFreq))));
            // the targets' "exact" bound (server/engine/targets/types.ts EXACT_TOLERANCE)
            expect(worst, `${reading.method} read for ${m.method}`).toBeLessThanOrEqual(1e-12);
          });
        }
      }
    }
  }
});
