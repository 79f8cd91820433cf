import type { PlanDetail } from "@shared/schemas/plans";
import { formatDateTime } from "@/lib/format";
import { StateBadge } from "./state-badge";

/** Who owns the plan, what it extends, and how many signatures it needs. */
export function PlanFacts({ plan }: { plan: PlanDetail }) {
  const raised = plan.effectiveRequiredApprovals > plan.requiredApprovals;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-note font-semibold tracking-wide text-ink-soft uppercase">
          Latest revision {plan.latestRevision}
        </span>
        <StateBadge state={plan.state} />
        {plan.approvedRevision !== null && (
          <span className="text-note text-ink-soft">signed revision: {plan.approvedRevision}</span>
        )}
      </div>
      <dl className="grid grid-cols-[9rem_1fr] gap-y-1 text-body sm:grid-cols-[9rem_1fr_9rem_1fr]">
        <dt className="text-ink-soft">Owner</dt>
        <dd>{plan.owner?.name ?? "unknown"}</dd>
        <dt className="text-ink-soft">Model</dt>
        <dd>{plan.model?.name ?? "profile removed"}</dd>
        <dt className="text-ink-soft">Passes needed</dt>
        <dd>
          {plan.effectiveRequiredApprovals}
          {raised && (
            <span className="text-note text-ink-soft">
              {" "}
              (plan asks {plan.requiredApprovals}; the lab minimum is higher)
            </span>
          )}
        </dd>
        <dt className="text-ink-soft">Last change</dt>
        <dd>{formatDateTime(plan.updatedAt)}</dd>
      </dl>
    </div>
  );
}
