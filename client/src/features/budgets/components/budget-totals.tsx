import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { formatCount, formatHours, formatMoney, formatScientific } from "@/lib/format";

/** The run's totals, each with its unit. */
export function BudgetTotals({
  totals,
  accelerators,
  currency,
  basis,
}: {
  totals: BudgetEstimateResponse["totals"];
  accelerators?: number;
  currency: string;
  /** Whether hours rest on an assumed utilisation or a measured throughput. */
  basis: BudgetEstimateResponse["assumptions"]["utilizationBasis"];
}) {
  const hoursNote = basis === "measured" ? "from the measured throughput" : "at the assumed utilisation";
  const items = [
    { label: "Tokens", value: formatCount(totals.tokens), unit: "tokens trained" },
    { label: "Compute", value: formatScientific(totals.flops), unit: "training FLOPs" },
    {
      label: "Accelerator-hours",
      value: formatHours(totals.acceleratorHours),
      unit: `summed over accelerators, ${hoursNote}`,
    },
    {
      label: "Wall-clock",
      value: formatHours(totals.wallClockHours),
      unit: accelerators ? `on ${accelerators} accelerators` : "at full cluster",
    },
    { label: "Cost", value: formatMoney(totals.cost, currency), unit: `workspace currency, ${hoursNote}` },
  ];
  return (
    <dl className="grid gap-3 sm:grid-cols-5" aria-label="Totals" data-testid="budget-totals">
      {items.map((it) => (
        <div key={it.label} className="rounded-md border border-rule bg-paper px-3 py-2">
          <dt className="text-note font-semibold tracking-wide text-ink-soft uppercase">{it.label}</dt>
          <dd className="text-title font-semibold tabular-nums" data-testid={`total-${it.label.toLowerCase()}`}>
            {it.value}
          </dd>
          <dd className="text-note text-ink-soft">{it.unit}</dd>
        </div>
      ))}
    </dl>
  );
}
