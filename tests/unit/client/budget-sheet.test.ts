import { describe, expect, it } from "vitest";
import { formatScientific } from "../../../client/src/lib/format";
import { draftFromPlanBudget, planBudgetFromDraft } from "../../../client/src/features/budgets/lib/plan-draft";
import { buildRequest } from "../../../client/src/features/budgets/lib/sheet-draft";
import { modelFromSearch, sheetFromSearch, toSearch } from "../../../client/src/features/budgets/lib/url-state";

// Moved out of tests/e2e/budget.e2e.test.ts: pure client logic needs no browser.
const GIB = 2 ** 30;

// The sheet's conversions, checked on their own: identities that must hold.
describe("budget sheet inputs", () => {
  it("a URL read into the sheet and written back is the same URL", () => {
    for (const q of [
      "model=3&acc=2&n=8&st=16384_64_200&st=32768_32_t1e9",
      "shape=6500000000_32_32_8_128__2&peak=400&mem=80&price=2.5&n=64&util=0.45&cp=4&lc=8&kvb=1&tps=3000&tpl=8192&vocab=128256&opt=18&mb=2&conv=full&ckpt=selective&fa=off&st=65536_64_400_yarn",
    ]) {
      const p = new URLSearchParams(q);
      const back = toSearch(modelFromSearch(p), sheetFromSearch(p));
      expect(Object.fromEntries([...back.keys()].map((k) => [k, back.getAll(k)]))).toEqual(
        Object.fromEntries([...p.keys()].map((k) => [k, p.getAll(k)])),
      );
    }
  });

  it("a plan's stored budget block read into the sheet and written back is unchanged", () => {
    for (const block of [
      { cluster: { acceleratorId: 7 }, accelerators: 32, contextParallel: 2, lossChunks: 4, vocabSize: 32_000 },
      {
        cluster: { acceleratorId: 7 },
        accelerators: 32,
        activationCheckpointing: "selective" as const,
        flashAttention: false,
        measuredTokensPerSecond: 2500,
      },
      {
        cluster: { peakFlops: 400e12, memoryBytes: 80 * GIB, pricePerHour: 2.5 },
        accelerators: 8,
        utilization: 0.35,
        convention: "full" as const,
        optimizerBytesPerParameter: 12,
      },
    ]) {
      expect(planBudgetFromDraft(draftFromPlanBudget(block))).toEqual(block);
    }
    // No accelerator chosen yet: the plan carries no budget rather than made-up figures.
    expect(planBudgetFromDraft(draftFromPlanBudget(undefined))).toBeUndefined();
  });

  it("inputs the shared contract refuses are named on the field, and nothing is sent", () => {
    const built = (q: string) => buildRequest(sheetFromSearch(new URLSearchParams(q)), { model: { modelId: 1 } });
    const typo = built("acc=1&n=8&st=16384_6x4_200&st=32768__100");
    expect(typo.request).toBeNull();
    expect(typo.issues["stages.0.globalBatch"]).toBe("Global batch of stage 1 must be a number.");
    expect(typo.issues["stages.1.globalBatch"]).toBe("Global batch of stage 2 is required.");
    const tooWide = built("acc=1&n=8&sp=16&st=16384_64_200");
    expect(tooWide.request).toBeNull();
    expect(tooWide.issues.contextParallel).toMatch(/cannot exceed accelerators/);
    expect(built("acc=1&n=8&cp=8&st=16384_64_200").request).not.toBeNull();
    // 16 383 tokens do not split into 2 × 2 chunks
    expect(built("acc=1&n=8&cp=2&st=16383_64_200").issues.contextParallel).toMatch(/divide by 2 × 2/);
  });

  it("links and plans saved before budget model 2 read as the new settings", () => {
    const old = sheetFromSearch(new URLSearchParams("acc=1&n=8&sp=4&rf=1&st=16384_64_200"));
    expect(old.settings).toMatchObject({ contextParallel: "4", activationCheckpointing: "full" });
    const stored = draftFromPlanBudget({
      cluster: { acceleratorId: 7 },
      accelerators: 8,
      sequenceSharding: 2,
      recomputeFraction: 0,
    });
    expect(planBudgetFromDraft(stored)).toEqual({
      cluster: { acceleratorId: 7 },
      accelerators: 8,
      contextParallel: 2,
      activationCheckpointing: "none",
    });
  });

  it("scientific notation keeps three significant figures and carries a rounded-up mantissa", () => {
    expect(formatScientific(3.1234e21)).toBe("3.12 × 10²¹");
    expect(formatScientific(9.9996e21)).toBe("1 × 10²²");
    expect(formatScientific(4.2e-7)).toBe("4.2 × 10⁻⁷");
  });
});
