import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { METHODS, runMethod } from "../../../server/engine";
import { rotate } from "../../../server/engine/frequencies";
import type { MethodId } from "../../../shared/schemas/analysis";
import { CTX, SAMPLE } from "./fixtures";

const dot = (a: ArrayLike<number>, b: ArrayLike<number>) => {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
};

// RoFormer (Su et al. 2021) Eq. 16: <R_m q, R_n k> depends only on m − n. Holds for any frequencies, so for every method.
describe("relative-position property of rotary embeddings", () => {
  for (const id of Object.keys(METHODS) as MethodId[]) {
    it(`${id}: the rotated dot product at (m, n) equals the one at (m + k, n + k)`, () => {
      const theta = Array.from(runMethod(CTX, SAMPLE[id]).invFreq);
      const vec = fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: CTX.d, maxLength: CTX.d });
      const pos = fc.integer({ min: 0, max: 100_000 });
      fc.assert(
        fc.property(vec, vec, pos, pos, pos, (q, k, m, n, shift) => {
          const a = dot(rotate(q, m, theta), rotate(k, n, theta));
          const b = dot(rotate(q, m + shift, theta), rotate(k, n + shift, theta));
          // angles up to 2·10^5 rad lose ~1e−11 each to rounding; the bound scales with |q|·|k| ≤ d
          expect(Math.abs(a - b)).toBeLessThan(1e-8);
        }),
        { numRuns: 100 },
      );
    });
  }

  it("the property is not vacuous: shifting only one side changes the product", () => {
    const theta = Array.from(runMethod(CTX, SAMPLE.default).invFreq);
    const q = Array.from({ length: CTX.d }, (_, i) => Math.sin(i + 1));
    expect(
      Math.abs(dot(rotate(q, 10, theta), rotate(q, 3, theta)) - dot(rotate(q, 11, theta), rotate(q, 3, theta))),
    ).toBeGreaterThan(1e-3);
  });
});
