import { isBudgetV2, type RevisionBudgetV2 } from "../../../shared/schemas/budget";
import type { RevisionBudgetV1 } from "../../../shared/schemas/budget-v1";
import { budgetSectionV1 } from "./report-budget-v1";
import type { RevisionContent } from "./revision-content";
import { esc, gib, sci } from "./report-format";

/** A link to the convention a figure rests on, stated once below the table. */
const see = (id: string) => `<a href="#budget-convention-${id}">†</a>`;

/** The budget section of the printable report, in the budget model the revision was frozen with. */
export function budgetSection(c: RevisionContent) {
  const b = c.budget;
  if (!b) return "";
  return isBudgetV2(b) ? budgetSectionV2(b) : budgetSectionV1(b as RevisionBudgetV1);
}

function budgetSectionV2(b: RevisionBudgetV2) {
  if ("skipped" in b) return `<h2>Budget</h2><p>${esc(b.skipped)}.</p>`;
  const e = b.estimate;
  const a = e.assumptions;
  const money = (v: number) => `${sci(v)} ${esc(b.currency)}`;
  const rows = e.stages
    .map((s, i) => {
      const m = s.trainingMemory;
      const change = s.fitChange
        ? `; fits with ${s.fitChange.activationCheckpointing} checkpointing, context parallelism ${s.fitChange.contextParallel}, loss chunks ${s.fitChange.lossChunks}`
        : "";
      const fit = s.fits ? "fits" : `<span class="bad">does not fit${change}</span>`;
      return `<tr><td>${i + 1}</td><td>${sci(s.tokens)}</td><td>${sci(s.flopsPerToken)}</td><td>${sci(s.acceleratorHours)}${s.utilizationBasis === "measured" ? " (measured)" : ""}</td>
<td>${sci(s.wallClockHours)}</td><td>${money(s.cost)}</td><td>${gib(s.kvCacheBytesPerSequence)}</td>
<td>${gib(m.total)} = ${gib(m.modelStates)} + ${gib(m.activationCheckpoints)} + ${gib(m.recomputeWorkspace)} + ${gib(m.logits)}</td><td>${fit}</td></tr>`;
    })
    .join("");
  const conventions = a.conventions
    .map(
      (k) =>
        `<li id="budget-convention-${k.id}"><b>${esc(k.title)}</b> (${esc(k.basis)}${k.source ? `: ${esc(k.source)}` : ""}): ${esc(k.statement)}</li>`,
    )
    .join("");
  return `<h2>Budget</h2>
<p>Cluster: ${b.inputs.accelerators} × ${esc(b.cluster.name ?? "custom accelerator")} (peak ${sci(b.cluster.peakFlops)} FLOP/s, ${gib(b.cluster.memoryBytes)}, ${money(b.cluster.pricePerHour)} per hour, copied from the catalog at submission). Budget model ${b.budgetModel}.</p>
<p>Settings: ${esc(a.convention)} FLOP convention, ${esc(a.activationCheckpointing)} checkpointing, flash attention ${a.flashAttention ? "on" : "off"}, context parallelism ${a.contextParallel}, loss chunks ${a.lossChunks}, utilisation ${sci(a.utilization)} (${esc(a.utilizationSource)}), vocabulary ${a.vocabSize ?? "not given"}.</p>
<table><tr><th>stage</th><th>tokens ${see("tokens")}</th><th>FLOPs/token ${see("flops")}</th><th>accelerator-h ${see("utilisation")}</th><th>wall-clock h</th><th>cost (${esc(b.currency)}) ${see("cost")}</th><th>KV cache / sequence ${see("kv-cache")}</th><th>training memory / accelerator = model states ${see("model-states")} + checkpoints + workspace ${see("activations")} + logits ${see("logits")}</th><th>memory ${see("fit")}</th></tr>${rows}
<tr><th>total</th><td>${sci(e.totals.tokens)}</td><td></td><td>${sci(e.totals.acceleratorHours)}</td><td>${sci(e.totals.wallClockHours)}</td><td>${money(e.totals.cost)}</td><td colspan="3"></td></tr></table>
<p>Serving ${see("serving")}: the longest context one accelerator serves beside the weights is ${sci(e.serving.longestServableContext)} tokens.</p>
<p>Conventions, stated once:</p><ul>${conventions}</ul>`;
}
