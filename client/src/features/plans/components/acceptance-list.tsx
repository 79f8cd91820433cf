import type { AcceptanceCriterion } from "@shared/schemas/plans";
import { formatCount } from "@/lib/format";

const WORDS = { ">=": "at least", ">": "above", "<=": "at most", "<": "below" } as const;

/** The long-context evaluations that decide whether the tuned model meets the plan. */
export function AcceptanceList({ criteria }: { criteria: AcceptanceCriterion[] }) {
  if (criteria.length === 0)
    return (
      <p className="text-body text-ink-soft">
        No acceptance criteria yet. A plan is only confirmed by evaluations of the tuned model; name them here.
      </p>
    );
  return (
    <ul className="flex flex-col gap-1 text-body">
      {criteria.map((c, i) => (
        <li key={i} className="rounded-md border border-rule bg-white/40 px-3 py-2">
          <span className="font-medium">{c.evaluation}</span> at {formatCount(c.contextLength)} tokens: {c.metric}{" "}
          {WORDS[c.comparison]} <span className="font-semibold">{c.threshold}</span>{" "}
          <span className="text-note text-ink-soft">({c.comparison})</span>
        </li>
      ))}
    </ul>
  );
}
