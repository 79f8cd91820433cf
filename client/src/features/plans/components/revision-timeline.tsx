import { Link } from "react-router-dom";
import type { RevisionSummary } from "@shared/schemas/plans";
import { paths } from "@/config/paths";
import { formatDateTime, shortHash } from "@/lib/format";
import { StateBadge } from "./state-badge";

/** Every revision, newest first, as a rope of knots: state, author, hash prefix and the decisions on it. */
export function RevisionTimeline({
  planId,
  revisions,
  selected,
}: {
  planId: number;
  revisions: RevisionSummary[];
  selected: number;
}) {
  const newestFirst = [...revisions].reverse();
  return (
    <ol className="relative flex flex-col gap-3 border-l-2 border-hemp-light/60 pl-4" aria-label="Revisions">
      {newestFirst.map((r) => {
        const current = r.number === selected;
        const approvals = r.decisions.filter((d) => d.round === r.round && d.decision === "approve").length;
        const sentBack = r.decisions.filter((d) => d.round === r.round && d.decision === "request_changes").length;
        return (
          <li key={r.number} className="relative">
            <span
              aria-hidden
              className={`absolute top-2 -left-[1.45rem] size-3 rounded-full border-2 ${current ? "border-hemp bg-hemp" : "border-hemp-light bg-paper"}`}
            />
            <Link
              to={paths.plan(planId, r.number)}
              aria-current={current ? "true" : undefined}
              className={`block rounded-md border px-3 py-2 no-underline transition-colors ${current ? "border-hemp bg-hemp-pale/60" : "border-rule bg-white/40 hover:border-hemp"}`}
            >
              <span className="flex flex-wrap items-center gap-2">
                <span className="font-semibold text-ink">Revision {r.number}</span>
                <StateBadge state={r.state} />
              </span>
              <span className="mt-1 block text-note text-ink-soft">
                {r.author?.name ?? "unknown author"} · {formatDateTime(r.createdAt)}
              </span>
              <span className="block text-note text-ink-soft">
                <code title={r.contentHash}>{shortHash(r.contentHash)}</code>
                {r.round > 0 &&
                  ` · round ${r.round}: ${approvals} pass${approvals === 1 ? "" : "es"}${sentBack ? `, ${sentBack} sent back` : ""}`}
              </span>
            </Link>
          </li>
        );
      })}
    </ol>
  );
}
