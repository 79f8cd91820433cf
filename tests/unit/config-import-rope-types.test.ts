import { describe, expect, it } from "vitest";
import { parseModelConfig } from "../../server/features/models/config-import";

/** A small config (d = 128) carrying the given rope_scaling block. */
const withScaling = (rope_scaling: Record<string, unknown>) =>
  JSON.stringify({
    hidden_size: 2048,
    num_attention_heads: 16,
    num_hidden_layers: 4,
    max_position_embeddings: 32768,
    rope_theta: 10000,
    rope_scaling: { original_max_position_embeddings: 4096, ...rope_scaling },
  });

describe("config import: rope_type names that are not ours", () => {
  // Plain object indexing would find Object.prototype members for these names.
  for (const type of ["constructor", "__proto__", "toString", "hasOwnProperty", "valueOf"]) {
    it(`"${type}" is an unknown rope_type, not a crash or an inherited value`, () => {
      const { profile, warnings } = parseModelConfig(withScaling({ rope_type: type, factor: 8 }));
      expect(warnings.map((w) => w.code)).toContain("unknown_rope_type");
      expect(warnings.map((w) => w.code)).not.toContain("unknown_scaling_key");
      expect(profile.currentScaling?.method).toBe(type);
      expect(typeof profile.currentScaling?.method).toBe("string");
    });
  }

  it("the older spelling su reads as longrope, and its keys are the longrope keys", () => {
    const f = Array.from({ length: 64 }, () => 1);
    const { profile, warnings } = parseModelConfig(
      withScaling({ type: "su", long_factor: f, short_factor: f, factor: 8 }),
    );
    expect(profile.currentScaling?.method).toBe("longrope");
    expect(warnings.map((w) => w.code)).toContain("factor_switching");
    expect(warnings.map((w) => w.code)).not.toContain("unknown_scaling_key");
  });
});
