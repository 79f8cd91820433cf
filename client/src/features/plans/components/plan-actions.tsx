import { useState } from "react";
import { Link, useNavigate } from "react-router-dom";
import type { SessionUser } from "@shared/schemas/auth";
import type { PlanDetail, RevisionSummary } from "@shared/schemas/plans";
import { isSigned } from "@shared/plan-rules";
import { ACTION_WORDS } from "@shared/review-words";
import { Button } from "@/components/button";
import { Notice } from "@/components/notice";
import { apiPaths, paths } from "@/config/paths";
import { useStartRevision, useSubmitRevision, useWithdrawRevision } from "../api/workflow";
import { actionErrorText } from "../lib/action-error";

type PlanActionsProps = {
  plan: PlanDetail;
  revision: RevisionSummary;
  user: SessionUser;
  /** False while the integrity check fails (or has not answered): exports are then not offered. */
  intact: boolean;
  onDecide?: () => void;
};

const linkButton =
  "inline-flex items-center justify-center gap-2 rounded-md border px-4 py-2 text-body font-medium no-underline transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-seaglass";
const primaryLink = `${linkButton} border-hemp bg-hemp text-paper hover:bg-hemp-dark`;
const secondaryLink = `${linkButton} border-rule-strong bg-paper text-ink hover:border-hemp`;

/** Only the steps the signed-in user may take on this revision, in its current state. */
export function PlanActions({ plan, revision, user, intact, onDecide }: PlanActionsProps) {
  const navigate = useNavigate();
  const submit = useSubmitRevision();
  const withdraw = useWithdrawRevision();
  const start = useStartRevision();
  const [error, setError] = useState<string | null>(null);
  const n = revision.number;
  const isAuthor = revision.author?.id === user.id;
  const researcher = user.roles.includes("researcher");
  const latest = plan.revisions[plan.revisions.length - 1];
  const mineToEdit = researcher && isAuthor && revision.state === "draft";
  const canStart =
    researcher && plan.owner?.id === user.id && n === latest.number && !["draft", "in_review"].includes(latest.state);
  const alreadyDecided = revision.decisions.some((d) => d.round === revision.round && d.approver.id === user.id);
  const canDecide = user.roles.includes("approver") && revision.state === "in_review" && !isAuthor && !alreadyDecided;
  const signed = isSigned(revision.state);
  const onError = (e: unknown) => setError(actionErrorText(e));

  return (
    <div className="flex flex-col gap-3">
      {error && <Notice tone="alert">{error}</Notice>}
      <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Revision actions">
        {mineToEdit && (
          <>
            <Link to={paths.planEdit(plan.id, n)} className={secondaryLink}>
              Edit draft
            </Link>
            <Button
              busy={submit.isPending}
              onClick={() => {
                setError(null);
                submit.mutate({ id: plan.id, n }, { onError });
              }}
            >
              {ACTION_WORDS.submit}
            </Button>
          </>
        )}
        {researcher && isAuthor && revision.state === "in_review" && (
          <Button
            variant="secondary"
            busy={withdraw.isPending}
            onClick={() => {
              setError(null);
              withdraw.mutate({ id: plan.id, n }, { onError });
            }}
          >
            {ACTION_WORDS.withdraw}
          </Button>
        )}
        {canStart && (
          <Button
            variant="secondary"
            busy={start.isPending}
            onClick={() => {
              setError(null);
              start.mutate({ id: plan.id }, { onError, onSuccess: (r) => navigate(paths.planEdit(plan.id, r.number)) });
            }}
          >
            Start new revision
          </Button>
        )}
        {canDecide && onDecide && (
          <Button onClick={onDecide}>
            {ACTION_WORDS.inspect} revision {n}
          </Button>
        )}
        {alreadyDecided && revision.state === "in_review" && (
          <span className="text-note text-ink-soft">You have inspected this round.</span>
        )}
        {signed &&
          (intact ? (
            <a href={apiPaths.revisionExport(plan.id, n, true)} download className={primaryLink}>
              Download export (config patch JSON)
            </a>
          ) : (
            <Button disabled title="Refused while the integrity check fails">
              Download export (config patch JSON)
            </Button>
          ))}
        <a href={apiPaths.revisionReport(plan.id, n)} target="_blank" rel="noreferrer" className={secondaryLink}>
          Open report
        </a>
        <a href={apiPaths.revisionReport(plan.id, n, true)} download className={secondaryLink}>
          Download report
        </a>
      </div>
    </div>
  );
}
