// `npm run bench`: each bench file exports one run function; add new ones to this list.
// `npm run bench -- speed` (or engine, budget, api, stages) runs one of them.
import { runEngineBench } from "./engine.bench";
import { runBudgetBench } from "./budget.bench";
import { runApiBench } from "./api.bench";
import { runSpeedBench } from "./speed.bench";
import { runStagesBench } from "./analyses-stages.bench";

const benches: Record<string, () => Promise<void> | void> = {
  engine: runEngineBench,
  budget: runBudgetBench,
  api: runApiBench,
  speed: runSpeedBench,
  stages: runStagesBench,
};
const only = process.argv[2];
if (only && !benches[only]) throw new Error(`no bench named ${only}; one of ${Object.keys(benches).join(", ")}`);
for (const [name, run] of Object.entries(benches)) if (!only || only === name) await run();
