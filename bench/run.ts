// `npm run bench`: each bench file exports one run function; add new ones to this list.
import { runEngineBench } from "./engine.bench";
import { runBudgetBench } from "./budget.bench";
import { runApiBench } from "./api.bench";

await runEngineBench();
await runBudgetBench();
await runApiBench();
