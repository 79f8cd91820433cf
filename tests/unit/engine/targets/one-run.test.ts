import { describe, expect, it } from "vitest";
import { TARGETS, TARGET_IDS, planRotary, type CompileInput } from "../../../../server/engine/targets";
import { LLAMA_LIKE } from "./helpers";

/*
 * An export runs the plan's method once (planRotary) and every compiler takes the filled parameters from that run.
 * Proof without counting calls: hand the compilers a run whose filled β_fast differs from the request's default
 * (32, Peng et al. 2023, YaRN, §A.2's recommended α = 1, β = 32): had any compiler run the method again, it would
 * write 32; all six write the run's 20.
 */
describe("one run of the method per export", () => {
  it("every target's compiler writes the filled parameters of the run it is handed", () => {
    const ctx = { d: 128, base: 500_000, trainedContext: 8192, targetContext: 32_768 };
    const method = { method: "yarn" as const };
    const plan = planRotary(ctx, method);
    expect(plan.params).toMatchObject({ method: "yarn", betaFast: 32 });
    const input: CompileInput = {
      config: LLAMA_LIKE,
      method,
      plan: { ...plan, params: { ...plan.params, method: "yarn", betaFast: 20 } },
    };
    for (const id of TARGET_IDS) {
      const text = TARGETS[id].compile(input).artifact?.text ?? "";
      // config patches: "beta_fast": 20.0; launch JSON: "beta_fast":20.0; llama.cpp: --yarn-beta-fast 20
      expect(text, id).toMatch(/beta_fast"?:\s?20\.0|--yarn-beta-fast 20\b/);
      expect(text, id).not.toMatch(/beta_fast"?:\s?32|--yarn-beta-fast 32\b/);
    }
  });
});
