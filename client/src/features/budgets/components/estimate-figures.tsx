import type { ReactNode } from "react";
import type { BudgetEstimateResult } from "@shared/schemas/budget";
import { AssumptionsList, ConventionLinks } from "./assumptions";
import { BudgetTotals } from "./budget-totals";
import { GrowthChart } from "./growth-chart";
import { MemoryFit } from "./memory-fit";
import { StageShareChart } from "./stage-chart";

type Props = {
  estimate: BudgetEstimateResult;
  memoryBytes: number;
  accelerators: number;
  /** True while newer inputs are being computed: the figures shown are the previous ones. */
  stale?: boolean;
  /** Extra controls beside the totals (the CSV download). */
  actions?: ReactNode;
};

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-3 border-t border-rule pt-4">
      <h3 className="text-lead font-semibold">{title}</h3>
      {children}
    </section>
  );
}

/** Totals, charts, memory and the conventions of one estimate: each figure links to the conventions it rests on. */
export function EstimateFigures({ estimate, memoryBytes, accelerators, stale, actions }: Props) {
  const a = estimate.assumptions;
  return (
    <div
      className={`flex flex-col gap-5 transition-opacity ${stale ? "opacity-60" : ""}`}
      aria-busy={stale || undefined}
      data-testid="estimate-figures"
    >
      <Section title="Totals">
        <BudgetTotals
          totals={estimate.totals}
          accelerators={accelerators}
          currency={estimate.currency}
          basis={a.utilizationBasis}
        />
        <ConventionLinks assumptions={a} ids={["tokens", "flops", "checkpointing-flops", "utilisation", "cost"]} />
        {actions}
      </Section>
      <Section title="Where the tokens and the hours go">
        <StageShareChart stages={estimate.stages} />
        <ConventionLinks assumptions={a} ids={["tokens", "utilisation"]} />
      </Section>
      <Section title="Growth with sequence length">
        <GrowthChart
          growth={estimate.growth}
          trainedContext={a.trainedContext}
          targetContext={a.targetContext}
          currency={estimate.currency}
        />
        <ConventionLinks assumptions={a} ids={["flops", "checkpointing-flops", "cost"]} />
      </Section>
      <Section title="Memory fit and serving">
        <MemoryFit estimate={estimate} memoryBytes={memoryBytes} />
        <ConventionLinks
          assumptions={a}
          ids={["model-states", "activations", "logits", "context-parallel", "fit", "kv-cache", "serving"]}
        />
      </Section>
      <Section title="Settings and conventions">
        <AssumptionsList assumptions={a} />
      </Section>
    </div>
  );
}
