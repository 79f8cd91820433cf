import { describe, expect, it } from "vitest";
import { analyse } from "../../../server/engine";
import { METHOD_CATALOG } from "../../../shared/methods";
import { dynamicBaseGrowth, dynamicFactorNote } from "../../../shared/methods/dynamic-factor";

/*
 * Issue 15: the dynamic method's factor defaults to L′/L. Checked here against arithmetic done by hand and against
 * the NTK-aware base change (Peng et al. 2023 §3.1, b′ = b·s^(d/(d−2))), which dynamic NTK at f = 1 must equal
 * at l = L′ (YaRN §3.3: s = max(1, l/L) fed to the NTK-aware base; that wording recalled from memory).
 */
const d = 128;

describe("the dynamic method's default factor, explained", () => {
  it("at 16 × the trained length the default f = s grows the base (1 + 16·15)^(d/(d−2)) = 241^(64/63) times", () => {
    // 1 + f·(l/L − 1) with f = l/L = 16 is 1 + 16·15 = 241: the "about 241 times" the issue measured.
    expect(dynamicBaseGrowth(16, d, 16 * 4096, 4096)).toBeCloseTo(Math.pow(241, 64 / 63), 9);
    // At or below the trained length the base is untouched, whatever the factor.
    expect(dynamicBaseGrowth(16, d, 2048, 4096)).toBe(1);
  });

  it("f = 1 is the NTK-aware base for s = l/L, and the engine's default is f = L′/L", () => {
    const r = analyse({
      model: { headDim: d, ropeTheta: 10_000, trainedContext: 4096 },
      targetContext: 65_536,
      methods: [{ method: "ntk" }, { method: "dynamic", factor: 1 }, { method: "dynamic" }],
    });
    const [ntk, dynamicOne, dynamicDefault] = r.methods;
    expect(dynamicOne.effectiveBase! / ntk.effectiveBase!).toBeCloseTo(1, 12);
    expect(ntk.effectiveBase! / 10_000).toBeCloseTo(Math.pow(16, 64 / 63), 9);
    expect(dynamicDefault.params).toMatchObject({ factor: 16 });
    expect(dynamicDefault.effectiveBase! / 10_000).toBeCloseTo(dynamicBaseGrowth(16, d, 65_536, 4096), 9);
  });

  it("the note beside the field gives both growths for the form's inputs, and words alone without them", () => {
    const note = dynamicFactorNote({ scale: 16, targetContext: 65_536, pairs: d / 2 });
    // 241^(64/63) ≈ 263 and 16^(64/63) ≈ 16.7, to three figures.
    expect(Number(Math.pow(241, 64 / 63).toPrecision(3))).toBe(263);
    expect(note).toContain("f = L′/L = 16");
    expect(note).toContain("×263");
    expect(note).toContain("×16.7");
    const words = dynamicFactorNote({ scale: null, targetContext: null, pairs: null });
    expect(words).toMatch(/s² − s \+ 1/);
    expect(words).not.toMatch(/×\d/);
    // The catalog's dynamic factor field carries the note; the other methods' factor fields do not need one.
    expect(METHOD_CATALOG.dynamic.fields[0].note).toBe(dynamicFactorNote);
    expect(METHOD_CATALOG.linear.fields[0].note).toBeUndefined();
  });
});
