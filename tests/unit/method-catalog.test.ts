import { describe, expect, it } from "vitest";
import { METHODS, runMethod } from "../../server/engine";
import { parseModelConfig } from "../../server/features/models/config-import";
import { ropeScalingKnownKeys } from "../../server/features/models/rope-scaling-keys";
import {
  findMethod,
  METHOD_CATALOG,
  METHOD_IDS,
  methodEntry,
  methodForRopeType,
  type FieldContext,
} from "../../shared/methods";
import { CTX, SAMPLE } from "./engine/fixtures";

const context: FieldContext = {
  scale: CTX.targetContext / CTX.trainedContext,
  targetContext: CTX.targetContext,
  pairs: CTX.d / 2,
};
/** The sample's required parameters only, so every optional one takes the engine's default. */
const requiredOnly = (id: (typeof METHOD_IDS)[number]) => {
  const entry = methodEntry(id);
  const sample = SAMPLE[id] as Record<string, unknown>;
  return Object.fromEntries(
    Object.entries(sample).filter(([k]) => k === "method" || entry.fields.some((f) => f.key === k && f.required)),
  );
};

describe("the method catalog, entry by entry", () => {
  it("every entry has a formula, and names that no other entry uses", () => {
    expect(Object.keys(METHODS).sort()).toEqual([...METHOD_IDS].sort());
    for (const key of ["label", "short"] as const) {
      const names = METHOD_IDS.map((id) => METHOD_CATALOG[id][key]);
      expect(new Set(names).size).toBe(names.length);
    }
  });

  for (const id of METHOD_IDS) {
    describe(id, () => {
      const entry = methodEntry(id);
      const shape = entry.schema.shape as Record<string, { isOptional(): boolean }>;
      const out = runMethod(CTX, requiredOnly(id) as never);
      const resolved = out.params as Record<string, unknown>;

      it("form fields are the schema's parameters, required exactly where the schema has no default", () => {
        expect(entry.fields.map((f) => f.key).sort()).toEqual(
          Object.keys(shape)
            .filter((k) => k !== "method")
            .sort(),
        );
        for (const f of entry.fields) expect(!!f.required).toBe(!shape[f.key].isOptional());
      });

      it("the default a form shows is the one the engine applies", () => {
        for (const f of entry.fields) {
          const shown = f.fallback?.(context);
          if (shown === undefined || shown === null) continue;
          expect(resolved[f.key], f.key).toBe(shown);
        }
        for (const [k, v] of Object.entries(entry.defaults)) expect(resolved[k], k).toBe(v);
      });

      it("the export writes its rope_type with keys the importer knows, and importing it back finds this method", () => {
        const block = out.ropeScaling.rope_scaling;
        expect(block?.rope_type ?? null).toBe(entry.exportType);
        const config = {
          hidden_size: CTX.d * 16,
          num_attention_heads: 16,
          num_hidden_layers: 4,
          max_position_embeddings: out.ropeScaling.max_position_embeddings,
          rope_theta: out.ropeScaling.rope_theta ?? CTX.base,
          ...(block ? { rope_scaling: block } : {}),
        };
        const { profile, warnings } = parseModelConfig(JSON.stringify(config));
        expect(warnings.map((w) => w.code)).not.toContain("unknown_scaling_key");
        if (block) {
          for (const key of Object.keys(block)) expect(ropeScalingKnownKeys(block.rope_type)).toContain(key);
          expect(profile.currentScaling?.method).toBe(id);
        } else {
          // No block: the method is carried by the base alone (Peng et al. 2023 §3.1 for NTK-aware).
          expect(profile.currentScaling).toBeNull();
          expect(profile.ropeTheta).toBe(out.effectiveBase ?? CTX.base);
        }
      });

      it("its explanation closes every formula it opens and names a source", () => {
        expect(entry.explanation.text.split("`").length % 2).toBe(1);
        expect(entry.explanation.source.length).toBeGreaterThan(5);
      });

      it("each rope_type it answers to leads back to it", () => {
        for (const t of entry.ropeTypes) expect(methodForRopeType(t)?.id).toBe(id);
        expect(findMethod(id)?.id).toBe(id);
      });
    });
  }

  it("names inherited from Object.prototype find no method", () => {
    for (const name of ["constructor", "__proto__", "toString", "hasOwnProperty", "prototype"]) {
      expect(findMethod(name)).toBeUndefined();
      expect(methodForRopeType(name)).toBeUndefined();
      expect(ropeScalingKnownKeys(name)).toBeUndefined();
    }
  });
});
