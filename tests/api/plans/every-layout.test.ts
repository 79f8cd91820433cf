import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { makeTestApp, type Agent } from "../../setup/app";
import { decide, post } from "../../setup/plans";
import { applyMergePatch } from "../../../server/engine/targets/merge-patch";

/*
 * Issue 11 end to end, one row per hand-written rotary layout in tests/fixtures/configs/: import (save) → plan ×4 on
 * the scaled group → submit → approve → the approved transformers-v5 export. Every expected number below was worked
 * by hand from the fixture's own keys (the comment on each row says how); none was copied from a previous run.
 * The per-key loader rules behind them are cited where the importer encodes them (server/features/models, docs/).
 */
const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../../fixtures/configs", n));
const uniq = () => Math.random().toString(36).slice(2, 8);

interface Group {
  kind: string;
  ropeTheta: number;
  rotaryDim: number;
}
interface Row {
  file: string;
  /** the pre-trained length the plan extends from (the ×4 target is four times it) */
  trained: number;
  method: "yarn" | "linear";
  /** the group the plan scales; the others stay as trained */
  scaled: Group;
  unscaled: Group[];
  /** groups with no position encoding: shown, never scaled, never flagged */
  noRope?: string[];
}

/**
 * One row per fixture: every layout scales its full-attention group; a second rotating group, where there is one, is the
 * sliding (local) group at its own base with the same rotating dims, left as trained.
 */
function layout(
  file: string,
  trained: number,
  method: Row["method"],
  full: { theta: number; dims: number },
  extra: { slidingTheta?: number; noRope?: string[] } = {},
): Row {
  const { slidingTheta, noRope } = extra;
  const group = (kind: string, ropeTheta: number) => ({ kind, ropeTheta, rotaryDim: full.dims });
  return {
    file,
    trained,
    method,
    scaled: group("full_attention", full.theta),
    unscaled: slidingTheta === undefined ? [] : [group("sliding_attention", slidingTheta)],
    noRope,
  };
}

const rows: Row[] = [
  // qk_rope_head_dim 64 rotates (not 7168/128 = 56); the shipped YaRN names original 4096, so 4096 is pre-trained.
  layout("latent-attention-yarn.json", 4096, "yarn", { theta: 10_000, dims: 64 }),
  // head_dim 256; full layers 1e6 pre-trained 16 384 (the block's original length); local layers rope_local_base_freq 1e4.
  layout("sliding-full-local-base.json", 16384, "linear", { theta: 1e6, dims: 256 }, { slidingTheta: 10_000 }),
  // The same layout as sliding_window_pattern 6 (every sixth layer full): same groups, same numbers.
  layout("sliding-pattern-local-base.json", 16384, "yarn", { theta: 1e6, dims: 256 }, { slidingTheta: 10_000 }),
  // rope_parameters nested by layer type: full yarn over 1e6 with original 32 768; sliding plain 1e4; head_dim 128.
  layout("nested-rope-parameters.json", 32768, "yarn", { theta: 1e6, dims: 128 }, { slidingTheta: 10_000 }),
  // 3584 / 28 = 128 rotating dims, sections 16 + 24 + 24 = 64 pairs; base 1e6, trained 32 768.
  layout("mrope-sections-contiguous.json", 32768, "linear", { theta: 1e6, dims: 128 }),
  // head_dim 128 (sections sum to 60, a warning, not a refusal); base 5e6, trained 262 144.
  layout("mrope-sections-interleaved-bad-sum.json", 262144, "yarn", { theta: 5e6, dims: 128 }),
  // 2560 / 32 = 80 per head, rotary_pct 0.25 → 20 rotate; rotary_emb_base 1e6 (not the 1e4 default).
  layout("neox-style-keys.json", 4096, "linear", { theta: 1e6, dims: 20 }),
  // Top level 1e4 beside rope_parameters 5e5: the newest loaders read 5e5. 4096 / 32 = 128; trained 8192.
  layout("conflict-base.json", 8192, "yarn", { theta: 500_000, dims: 128 }),
  // Top-level original 4096 beside the block's 2048: the loaders take 4096. 3072 / 24 = 128; base 1e4.
  layout("conflict-original-length.json", 4096, "yarn", { theta: 10_000, dims: 128 }),
  // type "su" read as longrope (with a warning); original 4096; 3072 / 32 = 96 dims = 48 pairs (48 factors).
  layout("legacy-type-su.json", 4096, "linear", { theta: 10_000, dims: 96 }),
  // no_rope_layers [1,1,1,0,1,1,1,0]: six rotary layers (2048 / 16 = 128, base 5e6) and two without positions.
  layout("mixed-rope-nope.json", 65536, "yarn", { theta: 5e6, dims: 128 }, { noRope: ["no_rope"] }),
];

/** Uploads a fixture as config.json with ?save=true; the refusals below use the same request. */
const upload = (a: Agent, file: string, name: string, parameters: number) =>
  a
    .post("/api/models/import?save=true")
    .set("X-CSRF-Token", a.csrf)
    .field("overrides", JSON.stringify({ name, parameters }))
    .attach("file", fixture(file), "config.json");

async function importSaved(a: Agent, file: string) {
  const r = await upload(a, file, `Walk-${uniq()}`, 3e9);
  if (r.status !== 201) throw new Error(`import ${file}: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body.saved.id as number;
}

/**
 * The v5 block one layer type runs with, read from config.json after the merge patch (RFC 7396: a nested entry the
 * patch leaves out is kept as it was): nested under the config's layer_types when it has them, else the flat block.
 */
function v5Block(file: string, patch: Record<string, unknown>, kind: string) {
  const merged = applyMergePatch(JSON.parse(fixture(file).toString()), patch) as Record<string, unknown>;
  const params = merged.rope_parameters as Record<string, Record<string, unknown>>;
  return Array.isArray(merged.layer_types) ? params[kind] : (params as Record<string, unknown>);
}

describe("every rotary layout walks import → plan ×4 → approve → transformers-v5 export", () => {
  it.each(rows)("$file", async (row) => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await importSaved(researcher, row.file);
    const target = row.trained * 4;
    const method = row.method === "linear" ? { method: "linear", factor: 4 } : { method: "yarn" };
    const created = await post(researcher, "/api/plans", {
      title: `Walk ${uniq()}`,
      modelId,
      revision: { targetContext: target, method },
    }).expect(201);
    const base = `/api/plans/${created.body.id}/revisions/1`;
    const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    const layered = row.unscaled.length + (row.noRope?.length ?? 0) > 0;

    // Flags for every rotating group: one scaled wavelength per rotating pair, flag arrays present.
    const rotating = [row.scaled, ...row.unscaled];
    if (layered) {
      const groups = rev.content.results.groups!;
      for (const g of rotating) {
        const got = groups.find((x) => x.kind === g.kind)!;
        expect(got, g.kind).toBeDefined();
        expect(got).toMatchObject({ ropeTheta: g.ropeTheta, rotaryDim: g.rotaryDim, scaled: g === row.scaled });
        expect(got.scaledWavelengths).toHaveLength(g.rotaryDim / 2);
        expect(got.flags).toBeDefined();
      }
      for (const k of row.noRope ?? []) expect(groups.find((x) => x.kind === k)?.scaled ?? false, k).toBe(false);
    } else {
      expect(rev.content.results.groups).toBeUndefined();
      expect(rev.content.results.rotaryDim).toBe(row.scaled.rotaryDim);
      expect(rev.content.results.final.scaledWavelengths).toHaveLength(row.scaled.rotaryDim / 2);
    }

    await post(researcher, `${base}/submit`).expect(200);
    await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
    const exp = exportEnvelopeSchema.parse(
      (await researcher.get(`/api/plans/${created.body.id}/approved/export?target=transformers-v5`).expect(200)).body,
    );
    expect(exp.fingerprint).toBe(rev.rotaryFingerprint);
    const artifact = exp.target!.artifact!;
    // The consumer reads every group as the plan signed it (per-group conformance, not only the scaled group's).
    expect(exp.target!.conformance.status).toBe("exact");
    // The scaled group carries the ×4 over its own base and its own pre-trained length.
    expect(v5Block(row.file, artifact.content, row.scaled.kind)).toMatchObject({
      rope_type: row.method,
      factor: 4,
      rope_theta: row.scaled.ropeTheta,
    });
    // Multimodal sections are the model's and stay with the block: its attention layers read them on every step
    // (server/engine/targets/hf/compile.ts cites where); the v5 patch removes rope_scaling, so they move along.
    const sections = (JSON.parse(fixture(row.file).toString()) as { rope_scaling?: Record<string, unknown> })
      .rope_scaling?.mrope_section;
    if (sections) {
      expect(v5Block(row.file, artifact.content, row.scaled.kind)).toMatchObject({ mrope_section: sections });
    }
    // Local groups exactly as trained: their base, no scaling keys at all.
    for (const g of row.unscaled) {
      expect(v5Block(row.file, artifact.content, g.kind)).toEqual({ rope_type: "default", rope_theta: g.ropeTheta });
      expect(exp.ropeParametersByLayerType![g.kind]).toEqual({ rope_type: "default", rope_theta: g.ropeTheta });
    }
  });
});

describe("layouts without rotary positions are refused", () => {
  it.each([
    "learned-absolute.json",
    "learned-absolute-n-positions.json",
    "sinusoidal-table.json",
    "alibi-bias.json",
    "no-position.json",
  ])("%s → 400 not_rotary", async (file) => {
    const a = await agentAs(["researcher"]);
    const r = await upload(a, file, `Flat-${uniq()}`, 1e8).expect(400);
    expect(r.body.error.code).toBe("not_rotary");
  });
});
