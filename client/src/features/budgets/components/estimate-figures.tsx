import type { ReactNode } from "react";
import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { AssumptionLine, AssumptionsList } from "./assumptions";
import { BudgetTotals } from "./budget-totals";
import { GrowthChart } from "./growth-chart";
import { MemoryFit } from "./memory-fit";
import { StageShareChart } from "./stage-chart";

type Props = {
  estimate: BudgetEstimateResponse;
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

/** Totals, charts, memory and assumptions of one estimate; the assumptions line sits under every figure. */
export function EstimateFigures({ estimate, memoryBytes, accelerators, stale, actions }: Props) {
  const line = <AssumptionLine assumptions={estimate.assumptions} accelerators={accelerators} />;
  return (
    <div
      className={`flex flex-col gap-5 transition-opacity ${stale ? "opacity-60" : ""}`}
      aria-busy={stale || undefined}
      data-testid="estimate-figures"
    >
      <Section title="Totals">
        <BudgetTotals totals={estimate.totals} accelerators={accelerators} />
        {line}
        {actions}
      </Section>
      <Section title="Where the tokens and the hours go">
        <StageShareChart stages={estimate.stages} />
        {line}
      </Section>
      <Section title="Growth with sequence length">
        <GrowthChart
          growth={estimate.growth}
          trainedContext={estimate.assumptions.trainedContext}
          targetContext={estimate.assumptions.targetContext}
        />
        {line}
      </Section>
      <Section title="Memory fit and serving">
        <MemoryFit
          stages={estimate.stages}
          memoryBytes={memoryBytes}
          sequenceSharding={estimate.assumptions.sequenceSharding}
        />
        {line}
      </Section>
      <Section title="Assumptions">
        <AssumptionsList assumptions={estimate.assumptions} />
      </Section>
    </div>
  );
}
