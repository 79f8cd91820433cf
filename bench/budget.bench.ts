import { performance } from "node:perf_hooks";
import { BUDGET_RECIPES, estimateBudget, recipeStage, type ResolvedBudgetInput } from "../server/engine/budget";

// Figures for the budget engine: time per estimate at a few plan sizes, and the numbers of one
// reference plan (a stated round 7e9 shape on a stated round accelerator) so a change in a formula shows.

const SHAPE = { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 };
const ACCELERATOR = { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 };

function planWith(stageCount: number, growthPoints: number, accelerators: number): ResolvedBudgetInput {
  const stages = Array.from({ length: stageCount }, (_, k) => ({
    sequenceLength: 4096 * 2 ** (k % 6),
    steps: 100 + k,
    globalBatch: 64,
  }));
  return { model: SHAPE, cluster: ACCELERATOR, accelerators, stages, growthPoints };
}

function timePerCall(label: string, input: ResolvedBudgetInput, budgetMs = 300) {
  for (let k = 0; k < 200; k++) estimateBudget(input); // warm-up
  let calls = 0;
  const start = performance.now();
  while (performance.now() - start < budgetMs) {
    estimateBudget(input);
    calls++;
  }
  const perCallUs = ((performance.now() - start) * 1000) / calls;
  console.log(
    `  ${label.padEnd(44)} ${perCallUs.toFixed(1).padStart(8)} µs/estimate  ${Math.round(1e6 / perCallUs)
      .toString()
      .padStart(8)} /s`,
  );
}

const fmt = (x: number, digits = 4) => x.toPrecision(digits);

export async function runBudgetBench(): Promise<void> {
  console.log("budget engine");
  timePerCall("1 stage, 9 growth points, 64 accelerators", planWith(1, 9, 64));
  timePerCall("4 stages, 9 growth points, 512 accelerators", planWith(4, 9, 512));
  timePerCall("32 stages, 64 growth points, 1e6 accelerators", planWith(32, 64, 1_000_000));

  console.log(
    "  reference: recipes on the round 7e9 shape (GQA 8 KV heads), 64 × (1e15 FLOP/s, 80e9 B, 2/h), MFU 0.4, target 65 536",
  );
  for (const recipe of BUDGET_RECIPES) {
    for (const convention of ["causal", "full"] as const) {
      const stage = recipeStage(recipe, 65_536, 64);
      const estimate = estimateBudget({
        model: SHAPE,
        cluster: ACCELERATOR,
        accelerators: 64,
        convention,
        stages: [stage],
      });
      const [s] = estimate.stages;
      console.log(
        `    ${recipe.id.padEnd(23)} ${convention.padEnd(6)} tokens ${fmt(s.tokens)}  FLOPs ${fmt(s.flops)}  ` +
          `acc-h ${fmt(s.acceleratorHours)}  wall-h ${fmt(s.wallClockHours)}  cost ${fmt(s.cost)}  ` +
          `mem/acc ${fmt(s.trainingMemoryPerAccelerator / 2 ** 30, 3)} GiB fits=${s.fits}`,
      );
    }
  }
}

// Run directly: node --import tsx bench/budget.bench.ts
if (import.meta.url === `file://${process.argv[1]}`) await runBudgetBench();
