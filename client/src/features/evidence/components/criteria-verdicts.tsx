import type { Evidence, CriterionVerdict } from "@shared/schemas/evidence-api";
import { EVIDENCE_KIND_INFO } from "@shared/schemas/evidence";
import { measuredAs, observedAgainstThreshold, type CriterionOptions } from "../lib/units";

export const STATUS_LABELS: Record<CriterionVerdict["status"], string> = {
  pass: "Holds",
  fail: "Fails",
  no_data: "No evidence yet",
  insufficient: "Evidence too short",
};
const STATUS_TONES: Record<CriterionVerdict["status"], string> = {
  pass: "border-seaglass/40 bg-seaglass-pale text-seaglass-dark",
  fail: "border-signal/40 bg-signal-pale text-signal-dark",
  no_data: "border-rule-strong bg-paper text-ink-soft",
  insufficient: "border-hemp/40 bg-hemp-pale text-hemp-dark",
};

type Props = {
  verdicts: CriterionVerdict[];
  options: CriterionOptions[];
  evidence: Evidence[];
};

/** One card per acceptance criterion: its status and why, observed against threshold, the deciding files, warnings. */
export function CriteriaVerdicts({ verdicts, options, evidence }: Props) {
  if (!verdicts.length) return <p className="text-body text-ink-soft">The revision states no acceptance criteria.</p>;
  const fileName = (id: number) => evidence.find((e) => e.id === id)?.fileName ?? `evidence ${id}`;
  return (
    <ol className="flex flex-col gap-3" aria-label="Acceptance criteria and their verdicts">
      {verdicts.map((v) => {
        const opts = options[v.index] ?? {};
        return (
          <li
            key={v.index}
            data-criterion={v.index}
            data-status={v.status}
            className="flex flex-col gap-1 rounded-md border border-rule bg-white/60 px-4 py-3"
          >
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <span className="font-medium">
                #{v.index + 1} {v.evaluation}
                <span className="text-note text-ink-soft">
                  {" "}
                  · {v.kind ? EVIDENCE_KIND_INFO[v.kind].label : "no kind"} at {v.contextLength.toLocaleString("en-US")}{" "}
                  tokens
                </span>
              </span>
              <span
                className={`inline-flex rounded-full border px-2 py-0.5 text-note font-medium ${STATUS_TONES[v.status]}`}
              >
                {STATUS_LABELS[v.status]}
              </span>
            </div>
            <p className="text-body">
              <span className="text-ink-soft">{measuredAs(v.kind, opts)}: </span>
              <span data-testid="observed">{observedAgainstThreshold(v, opts)}</span>
              {v.effectiveLength !== undefined && v.effectiveLength !== null && (
                <span className="text-ink-soft"> · effective length {v.effectiveLength.toLocaleString("en-US")}</span>
              )}
            </p>
            {/* A holding criterion is said in full by the observed-against-threshold line; the others need the reason. */}
            {v.status !== "pass" && <p className="text-note text-ink-soft">{v.reason}</p>}
            {v.evidenceIds.length > 0 && (
              <p className="text-note text-ink-soft">
                Decided by {v.evidenceIds.map((id) => `${fileName(id)} (#${id})`).join(", ")}
              </p>
            )}
            {v.warnings.map((w) => (
              <p key={w} className="text-note text-hemp-dark" data-testid="provenance-warning">
                Provenance: {w}
              </p>
            ))}
          </li>
        );
      })}
    </ol>
  );
}
