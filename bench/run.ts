// `npm run bench`: each bench file exports one run function; add new ones to this list.
// `npm run bench -- speed` (or engine, budget, api, stages, analyses) runs one of them.
import { runEngineBench } from "./engine.bench";
import { runBudgetBench } from "./budget.bench";
import { runApiBench } from "./api.bench";
import { runSpeedBench } from "./speed.bench";
import { runStagesBench } from "./analyses-stages.bench";
import { runAnalysesLoadBench } from "./analyses-load.bench";

const benches: Record<string, () => Promise<void> | void> = {
  engine: runEngineBench,
  budget: runBudgetBench,
  api: runApiBench,
  speed: runSpeedBench,
  stages: runStagesBench,
  analyses: runAnalysesLoadBench,
};
const only = process.argv[2];
if (only && !benches[only]) throw new Error(`no bench named ${only}; one of ${Object.keys(benches).join(", ")}`);
// Run only when named: the analyses load runs repeat the speed table's, for before/after comparisons.
const onlyWhenNamed = new Set(["analyses"]);
for (const [name, run] of Object.entries(benches)) if (only ? only === name : !onlyWhenNamed.has(name)) await run();
