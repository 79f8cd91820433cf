import { describe, expect, it } from "vitest";
import { runProbe, writeConfig, writeStandIn } from "../setup/probe";
import { handFingerprint } from "../setup/hand-fingerprint";
import { rotaryFingerprint } from "../../server/engine/fingerprint";

/*
 * The probe's per-layer-type reading (tools/probe/ropewalk_probe.py, issue 11), under Debian's python3 with the
 * stand-in library of tests/setup/probe.ts. The rule it follows is transformers 5.x's: rope_parameters is nested when
 * its keys are a subset of config.layer_types (modeling_rope_utils.py, RotaryEmbeddingConfigMixin.
 * standardize_rope_params, "Case 2"), and the model's rotary module builds one inv_freq and attention scaling per
 * layer type with rope_init_fn(config, device, layer_type=...), skipping a type whose entry is None; layer i rotates
 * with config.layer_types[i]'s (huggingface/transformers src/transformers/models/gemma3/modeling_gemma3.py at
 * 0018aa647bb1, Gemma3RotaryEmbedding.__init__ and Gemma3Attention; a 5.x-line commit).
 *
 * Hand-worked values: head_dim 8 rotates 4 pairs, θ_i = b^(−2i/d) (Su et al. 2021, RoFormer eq. 15). Bases 256 and
 * 65 536 make every θ an exact power of two (256^(1/4) = 4, 65 536^(1/4) = 16), so any correctly rounded pow gives
 * them exactly and the fingerprints below are written from the hand values, not from the probe's output:
 *   local, base 256:            1, 1/4, 1/16, 1/64
 *   full, base 65 536, linear ×4: (1, 1/16, 1/256, 1/4096) / 4 = 1/4, 1/64, 1/1024, 1/16384 (Chen et al. 2023, eq. 2)
 */
const SHAPE = {
  model_type: "llama",
  hidden_size: 64,
  num_attention_heads: 8,
  head_dim: 8,
  max_position_embeddings: 4096,
};
const LOCAL = [1, 1 / 4, 1 / 16, 1 / 64];
const FULL_X4 = [1 / 4, 1 / 64, 1 / 1024, 1 / 16384];
const NESTED = {
  sliding_attention: { rope_type: "default", rope_theta: 256 },
  full_attention: { rope_type: "linear", factor: 4, rope_theta: 65536 },
};
const SINGLE_GROUP_KEYS = [
  "probe",
  "library",
  "libraryVersion",
  "python",
  "ropeType",
  "readFrom",
  "layerType",
  "runningLength",
  "rotaryDim",
  "attentionFactor",
  "invFreq",
  "planFingerprint",
  "readFingerprint",
];

function probeJson(config: Record<string, unknown>, flavour: "v4" | "v5" = "v5") {
  const r = runProbe(["--config", writeConfig(config), "--length", "16384"], writeStandIn(flavour));
  expect(r.stderr).toBe("");
  expect(r.status).toBe(0);
  return JSON.parse(r.stdout);
}

describe("probe: every layer type of a nested rope_parameters", () => {
  it("sliding/full: one reading per layer type in first-layer order, one fingerprint record each", () => {
    const layerTypes = [
      "sliding_attention",
      "sliding_attention",
      "full_attention",
      "sliding_attention",
      "sliding_attention",
      "full_attention",
    ];
    const out = probeJson({ ...SHAPE, num_hidden_layers: 6, layer_types: layerTypes, rope_parameters: NESTED });
    expect(out.layerGroups).toEqual([
      {
        layerType: "sliding_attention",
        layers: [0, 1, 3, 4],
        ropeType: "default",
        readFrom: "rope_parameters.sliding_attention",
        rotaryDim: 8,
        attentionFactor: 1,
        invFreq: LOCAL,
      },
      {
        layerType: "full_attention",
        layers: [2, 5],
        ropeType: "linear",
        readFrom: "rope_parameters.full_attention",
        rotaryDim: 8,
        attentionFactor: 1,
        invFreq: FULL_X4,
      },
    ]);
    // The top level is the scaled group's reading (full attention), as a one-group reader expects it.
    expect(out).toMatchObject({
      ropeType: "linear",
      readFrom: "rope_parameters.full_attention",
      layerType: "full_attention",
      rotaryDim: 8,
      invFreq: FULL_X4,
    });
    const expected = handFingerprint([
      { d: 8, a: 1, theta: LOCAL },
      { d: 8, a: 1, theta: FULL_X4 },
    ]);
    expect(out.readFingerprint).toBe(expected);
    // the server's fingerprint code gives the same string for the same two groups (docs/fingerprint.md)
    expect(
      rotaryFingerprint([
        { rotaryDim: 8, attentionFactor: 1, invFreq: LOCAL },
        { rotaryDim: 8, attentionFactor: 1, invFreq: FULL_X4 },
      ]),
    ).toBe(expected);
  });

  it("the record order follows each type's first layer, not the order of the rope_parameters keys", () => {
    const out = probeJson({
      ...SHAPE,
      num_hidden_layers: 3,
      layer_types: ["full_attention", "sliding_attention", "sliding_attention"],
      rope_parameters: NESTED,
    });
    expect(out.layerGroups.map((g: { layerType: string }) => g.layerType)).toEqual([
      "full_attention",
      "sliding_attention",
    ]);
    expect(out.readFingerprint).toBe(
      handFingerprint([
        { d: 8, a: 1, theta: FULL_X4 },
        { d: 8, a: 1, theta: LOCAL },
      ]),
    );
  });

  it("a layer type whose entry is null rotates nothing and adds no record", () => {
    const out = probeJson({
      ...SHAPE,
      num_hidden_layers: 2,
      layer_types: ["sliding_attention", "full_attention"],
      rope_parameters: { ...NESTED, sliding_attention: null },
    });
    expect(out.layerGroups).toHaveLength(1);
    expect(out.layerGroups[0]).toMatchObject({ layerType: "full_attention", layers: [1] });
    // one record: the same bytes as a one-group model rotating with the full layers' setting
    expect(out.readFingerprint).toBe(handFingerprint([{ d: 8, a: 1, theta: FULL_X4 }]));
  });

  it("a layer type with no entry at all is refused (the library would fail to load the config)", () => {
    const config = {
      ...SHAPE,
      num_hidden_layers: 2,
      layer_types: ["chunked_attention", "full_attention"],
      rope_parameters: { full_attention: NESTED.full_attention },
    };
    const r = runProbe(["--config", writeConfig(config), "--length", "4096"], writeStandIn("v5"));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/nested by layer type but has no entry for chunked_attention/);
  });
});

describe("probe: a config that carries one setting stays one group", () => {
  it("layer_types beside a flat block (v5 folds rope_scaling in): one reading, the one-group format key for key", () => {
    const out = probeJson({
      ...SHAPE,
      num_hidden_layers: 2,
      layer_types: ["sliding_attention", "full_attention"],
      rope_theta: 65536,
      rope_scaling: { rope_type: "linear", factor: 4 },
    });
    expect(Object.keys(out)).toEqual(SINGLE_GROUP_KEYS);
    expect(out).toMatchObject({ readFrom: "rope_parameters", layerType: null, invFreq: FULL_X4 });
    expect(out.readFingerprint).toBe(handFingerprint([{ d: 8, a: 1, theta: FULL_X4 }]));
  });

  it("4.x layout (rope_scaling, no nesting): unchanged, one record", () => {
    const out = probeJson({ ...SHAPE, rope_theta: 256 }, "v4");
    expect(Object.keys(out)).toEqual(SINGLE_GROUP_KEYS);
    expect(out).toMatchObject({ readFrom: "none", ropeType: "default", invFreq: LOCAL });
    expect(out.readFingerprint).toBe(handFingerprint([{ d: 8, a: 1, theta: LOCAL }]));
  });
});
