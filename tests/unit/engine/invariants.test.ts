import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { METHODS, runMethod } from "../../../server/engine";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import { classifyPairs } from "../../../server/engine/pairs";
import {
  configPatchSchema,
  DEFAULT_BANDS,
  METHOD_IDS,
  methodParamsSchema,
  type MethodId,
} from "../../../shared/schemas/analysis";
import { METHOD_CATALOG } from "../../../shared/methods";
import { CTX, SAMPLE } from "./fixtures";

const ids: MethodId[] = METHOD_IDS;
const theta = inverseFrequencies(CTX.d, CTX.base);
const s = CTX.targetContext / CTX.trainedContext;
const window = { trainedContext: CTX.trainedContext, targetContext: CTX.targetContext, bands: DEFAULT_BANDS };

describe("shared invariants, for every method in the table", () => {
  it("the formula table and the catalog list the same method ids", () => {
    expect(Object.keys(METHODS).sort()).toEqual([...ids].sort());
  });

  for (const id of ids) {
    describe(id, () => {
      const out = runMethod(CTX, SAMPLE[id]);

      it("returns d/2 finite positive frequencies and a finite positive attention factor", () => {
        expect(out.invFreq).toHaveLength(CTX.d / 2);
        for (const t of out.invFreq) expect(Number.isFinite(t) && t > 0).toBe(true);
        expect(Number.isFinite(out.attentionFactor) && out.attentionFactor > 0).toBe(true);
      });

      it("never speeds a pair up when extending (θ'_i ≤ θ_i for these extension samples)", () => {
        Array.from(out.invFreq).forEach((t, i) => expect(t).toBeLessThanOrEqual(theta[i] * (1 + 1e-12)));
      });

      it("resolves every default into params that pass the schema, and re-running with them changes nothing", () => {
        expect(methodParamsSchema.safeParse(out.params).success).toBe(true);
        const again = runMethod(CTX, out.params);
        expect(Array.from(again.invFreq)).toEqual(Array.from(out.invFreq));
        expect(again.attentionFactor).toBe(out.attentionFactor);
      });

      it("exports a config patch in the open convention, with the trained length as the original length", () => {
        const patch = configPatchSchema.parse(out.ropeScaling);
        expect(patch.rope_scaling?.rope_type ?? null).toBe(METHOD_CATALOG[id].exportType);
        if (patch.rope_scaling) {
          expect(patch.rope_scaling).toHaveProperty("original_max_position_embeddings", CTX.trainedContext);
        }
        // dynamic keeps the trained length: loaders use max_position_embeddings as L (see methods/dynamic.ts)
        expect(patch.max_position_embeddings).toBe(id === "dynamic" ? CTX.trainedContext : CTX.targetContext);
      });
    });
  }

  it("with factor 1 the static scaling methods are plain RoPE (dynamic is not: its base still grows with length)", () => {
    for (const id of ["linear", "ntk", "yarn", "llama3"] as const) {
      const out = Array.from(runMethod(CTX, { method: id, factor: 1 }).invFreq);
      out.forEach((t, i) => expect(t / theta[i]).toBeCloseTo(1, 14));
    }
  });
});

describe("relations between methods", () => {
  it("linear = default / s, pair by pair (Chen et al. 2023)", () => {
    const lin = METHODS.linear(CTX, { method: "linear" }).invFreq;
    const def = METHODS.default(CTX, { method: "default" }).invFreq;
    def.forEach((t, i) => expect(lin[i]).toBe(t / s));
  });

  it("YaRN lies between default/s and default, pair by pair, for any valid parameters", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 512, noNaN: true }),
        fc.double({ min: 0.1, max: 200, noNaN: true }),
        fc.double({ min: 1.01, max: 100, noNaN: true }),
        fc.boolean(),
        (factor, betaSlow, ratio, truncate) => {
          const out = METHODS.yarn(CTX, {
            method: "yarn",
            factor,
            betaSlow,
            betaFast: betaSlow * ratio,
            truncate,
          }).invFreq;
          theta.forEach((t, i) => {
            expect(out[i]).toBeGreaterThanOrEqual((t / factor) * (1 - 1e-12));
            expect(out[i]).toBeLessThanOrEqual(t * (1 + 1e-12));
          });
        },
      ),
      { numRuns: 200 },
    );
  });

  it("dynamic at a length at or below the trained length equals default exactly", () => {
    for (const sequenceLength of [1, 100, CTX.trainedContext]) {
      for (const factor of [2, 2.7, 8, 31.5]) {
        const dyn = METHODS.dynamic(CTX, { method: "dynamic", factor, sequenceLength });
        expect(Array.from(dyn.invFreq)).toEqual(Array.from(theta));
        expect(dyn.effectiveBase).toBe(CTX.base);
      }
    }
  });

  it("dynamic at l = L' with f = s uses (s² − s + 1)^(d/(d−2)), a larger base than NTK-aware's s^(d/(d−2))", () => {
    const dyn = METHODS.dynamic(CTX, { method: "dynamic" });
    // (f·L'/L − (f − 1)) with f = s: s² − s + 1 > s for s > 1, so dynamic goes further than NTK at the same factor
    expect(dyn.effectiveBase).toBeCloseTo(CTX.base * Math.pow(s * s - s + 1, 128 / 126), 3);
    expect(dyn.effectiveBase!).toBeGreaterThan(METHODS.ntk(CTX, { method: "ntk" }).effectiveBase!);
  });

  it("the adjusted-base method with the original base equals default", () => {
    const out = METHODS.base(CTX, { method: "base", base: CTX.base });
    expect(Array.from(out.invFreq)).toEqual(Array.from(theta));
  });

  it("linear never sets unseenAngles, at any target (DOMAIN: position interpolation never extrapolates)", () => {
    fc.assert(
      fc.property(fc.integer({ min: CTX.trainedContext + 1, max: 2 ** 31 }), (target) => {
        const ctx = { ...CTX, targetContext: target };
        const pairs = classifyPairs(theta, METHODS.linear(ctx, { method: "linear" }).invFreq, {
          ...window,
          targetContext: target,
        });
        expect(pairs.some((p) => p.unseenAngles)).toBe(false);
      }),
      { numRuns: 200 },
    );
  });
});

describe("pair flags (docs/rotary-scaling.md definitions)", () => {
  const flags = (id: MethodId) => classifyPairs(theta, runMethod(CTX, SAMPLE[id]).invFreq, window);

  it("pairs 46-63 exceed the trained window for d = 128, b = 10 000, L = 4096 (Liu et al. 2023: 36 dimensions beyond d_extra = 92)", () => {
    const exceeding = flags("default")
      .filter((p) => p.exceedsTrainedWindow)
      .map((p) => p.index);
    expect(exceeding).toEqual(Array.from({ length: 18 }, (_, i) => 46 + i));
  });

  it("NTK-aware sets unseenAngles on low-frequency pairs 46-62; pair 63 is divided by exactly s so it stays inside (Peng et al. 2023 §3.1)", () => {
    expect(
      flags("ntk")
        .filter((p) => p.unseenAngles)
        .map((p) => p.index),
    ).toEqual(Array.from({ length: 17 }, (_, i) => 46 + i));
  });

  it("default (plain extrapolation) sets unseenAngles on every pair that exceeds the trained window", () => {
    const f = flags("default");
    expect(f.filter((p) => p.unseenAngles)).toEqual(f.filter((p) => p.exceedsTrainedWindow));
  });

  it("linear compresses every spinning pair (r ≥ 32: pairs 0-20); YaRN with β_fast = β compresses none (floor(c(β)) bounds the spinning index)", () => {
    const lin = flags("linear");
    expect(lin.filter((p) => p.compressedResolution).map((p) => p.index)).toEqual(
      Array.from({ length: 21 }, (_, i) => i),
    );
    expect(lin.filter((p) => p.band === "spinning").map((p) => p.index)).toEqual(
      Array.from({ length: 21 }, (_, i) => i),
    );
    expect(flags("yarn").some((p) => p.compressedResolution)).toBe(false);
  });

  it("bands follow r = L/λ against α and β", () => {
    for (const p of flags("default")) {
      const r = p.rotationsInTrainedWindow;
      expect(p.band).toBe(r >= 32 ? "spinning" : r >= 1 ? "turning" : "drifting");
      expect(r).toBeCloseTo(CTX.trainedContext / p.wavelength, 12);
      expect(p.exceedsTrainedWindow).toBe(r < 1);
    }
  });
});
