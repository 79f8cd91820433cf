import { useId } from "react";
import type { Accelerator, BudgetEstimateResponse } from "@shared/schemas/budget";
import { formatBytes, formatMoney, sig3, TFLOPS } from "@/lib/format";
import { EXAMPLE_CLUSTER, type ClusterDraft, type Convention, type SettingsDraft } from "../lib/sheet-draft";
import { Radio } from "@/components/radio";
import { MemorySettings } from "./memory-settings";
import { SheetFieldRow, type SheetField } from "./sheet-input";
import { ChoiceField } from "@/components/field";

type Issues = Record<string, string>;
type Props = {
  cluster: ClusterDraft;
  settings: SettingsDraft;
  accelerators: Accelerator[];
  assumptions: BudgetEstimateResponse["assumptions"] | undefined;
  /** The workspace currency, once an estimate has said it. */
  currency?: string;
  issues: Issues;
  disabled?: boolean;
  onCluster: (next: ClusterDraft) => void;
  onSettings: (next: SettingsDraft) => void;
};

const CONVENTION_LABELS: Record<Convention, string> = {
  causal: "Causal (attention counted for the tokens each position sees)",
  full: "Full (every position attends to the whole sequence)",
};

/** A custom accelerator's figures, in the units people quote; request issues name the request's fields. */
const customFigures = (currency: string | undefined): SheetField<ClusterDraft>[] => [
  {
    field: "peakTflops",
    label: "Dense peak",
    unit: "TFLOP/s",
    issueKeys: ["cluster.peakFlops"],
    hint: "At the training precision, no sparsity",
  },
  { field: "memoryGib", label: "Memory per accelerator", unit: "GiB", issueKeys: ["cluster.memoryBytes"] },
  {
    field: "pricePerHour",
    label: "Price per accelerator-hour",
    issueKeys: ["cluster.pricePerHour"],
    hint: currency ? `In ${currency}, the workspace currency` : "In the workspace currency",
  },
];

const RUN_FIGURES: SheetField<SettingsDraft>[] = [
  { field: "accelerators", label: "Accelerators", hint: "Across the whole run" },
  {
    field: "utilization",
    label: "Model FLOPs utilisation",
    placeholder: "0.4",
    hint: "Blank: 0.4, an assumed figure (common practice, no source); ignored with a measured throughput",
  },
  {
    field: "measuredTokensPerSecond",
    label: "Measured tokens/s per accelerator",
    hint: "From a real step: utilisation is then derived, not assumed",
  },
  {
    field: "measuredSequenceLength",
    label: "Measured at sequence length",
    hint: "Blank: the first stage's length",
  },
];

/** Which accelerators, how many, and the conventions the figures rest on. */
export function ClusterSettings({
  cluster,
  settings,
  accelerators,
  assumptions,
  currency,
  issues,
  disabled,
  onCluster,
  onSettings,
}: Props) {
  const uid = useId();
  const picked = accelerators.find((a) => String(a.id) === cluster.acceleratorId);
  // Retired accelerators leave the picker, except the one already chosen, so a link or a draft still names it.
  const offered = accelerators.filter((a) => !a.retiredAt || a === picked);
  const convention = settings.convention || assumptions?.convention || "causal";
  return (
    <div className="flex flex-col gap-5">
      <fieldset className="flex flex-col gap-3" disabled={disabled}>
        <legend className="mb-2 text-body font-semibold">Accelerator</legend>
        <div className="flex flex-wrap gap-4">
          <Radio
            name={`${uid}-cluster`}
            checked={cluster.kind === "catalog"}
            onChange={() => onCluster({ ...cluster, kind: "catalog" })}
            label="From the catalog"
          />
          <Radio
            name={`${uid}-cluster`}
            checked={cluster.kind === "custom"}
            onChange={() => onCluster({ ...cluster, kind: "custom" })}
            label="Custom figures"
          />
        </div>
        {cluster.kind === "catalog" ? (
          <ChoiceField
            className="max-w-xl"
            label="Catalog accelerator"
            value={cluster.acceleratorId}
            onChange={(acceleratorId) => onCluster({ ...cluster, acceleratorId })}
            emptyLabel="Pick one…"
            options={offered.map((a) => ({ value: String(a.id), label: a.retiredAt ? `${a.name} (retired)` : a.name }))}
            error={issues["cluster.acceleratorId"]}
            hint={
              offered.length
                ? undefined
                : "The catalog is empty; an infra lead adds accelerators on the Accelerators page."
            }
          />
        ) : (
          <SheetFieldRow
            className="grid gap-3 sm:grid-cols-3"
            fields={customFigures(currency)}
            draft={cluster}
            onChange={onCluster}
            issues={issues}
          />
        )}
        {cluster.kind === "custom" &&
          (["peakTflops", "memoryGib", "pricePerHour"] as const).every((k) => cluster[k] === EXAMPLE_CLUSTER[k]) && (
            <p className="text-note text-hemp-dark" data-testid="example-figures">
              Example figures, not any real accelerator's: type your hardware's, or pick one from the catalog.
            </p>
          )}
        {cluster.kind === "catalog" && picked?.retiredAt && (
          <p
            role="status"
            className="rounded-md border border-l-4 border-hemp/30 border-l-hemp bg-hemp-pale/40 px-4 py-2 text-body"
            data-testid="retired-accelerator"
          >
            {picked.name} is retired from the catalog. These figures use its last catalog numbers; pick another
            accelerator for new work (a plan draft cannot be submitted on it).
          </p>
        )}
        {cluster.kind === "catalog" && picked && (
          <p className="text-note text-ink-soft" data-testid="picked-accelerator">
            {picked.name}: {sig3(picked.peakFlops / TFLOPS)} TFLOP/s dense peak, {formatBytes(picked.memoryBytes)},{" "}
            {formatMoney(picked.pricePerHour, currency)} per hour
            {picked.notes ? ` — ${picked.notes}` : ""}
          </p>
        )}
        <SheetFieldRow
          className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
          fields={RUN_FIGURES}
          draft={settings}
          onChange={onSettings}
          issues={issues}
        />
      </fieldset>

      <fieldset className="flex flex-col gap-2" disabled={disabled}>
        <legend className="mb-2 text-body font-semibold">FLOP convention</legend>
        {(Object.keys(CONVENTION_LABELS) as Convention[]).map((c) => (
          <Radio
            key={c}
            name={`${uid}-convention`}
            checked={convention === c}
            onChange={() => onSettings({ ...settings, convention: c })}
            label={CONVENTION_LABELS[c]}
          />
        ))}
        {assumptions && assumptions.convention === convention && (
          <p className="text-note text-ink-soft" data-testid="convention-formula">
            Training FLOPs per token = <span className="font-mono">{assumptions.conventionFormula}</span> —{" "}
            {assumptions.conventionSource}
            {settings.convention === "" && " (the default)"}
          </p>
        )}
      </fieldset>

      <MemorySettings settings={settings} issues={issues} disabled={disabled} onSettings={onSettings} />
    </div>
  );
}
