import { METHOD_IDS } from "../shared/schemas/analysis";

/**
 * The analysis question every speed bench asks: each of the methods on a d = 128 model trained to 8 192 with base
 * 500 000, stretched to 1 048 576. LongRoPE gets a 64-pair ramp (1 to 32.5, short factors 1) and the base method a
 * base of 5e7; the others their defaults. One definition so the benches' figures stay comparable.
 */
export function everyMethodQuestion() {
  const ramp = Array.from({ length: 64 }, (_, i) => 1 + i / 2);
  return {
    model: { headDim: 128, ropeTheta: 500000, trainedContext: 8192 },
    targetContext: 1_048_576,
    methods: METHOD_IDS.map((m) =>
      m === "longrope"
        ? { method: m, longFactor: ramp, shortFactor: ramp.map(() => 1) }
        : m === "base"
          ? { method: m, base: 5e7 }
          : { method: m },
    ),
  };
}
