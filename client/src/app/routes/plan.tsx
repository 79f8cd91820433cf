import { useState } from "react";
import { LabelledCode } from "@/components/labelled-code";
import { Link, useParams, useSearchParams } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import type { RevisionContent } from "@shared/schemas/plans";
import { ACTION_WORDS, passesText } from "@shared/review-words";
import { ErrorView } from "@/components/error-view";
import { Page, Panel } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { formatDateTime } from "@/lib/format";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { plansQueries } from "@/features/plans/api/queries";
import { useRefreshPlan } from "@/features/plans/api/workflow";
import { AcceptanceList } from "@/features/plans/components/acceptance-list";
import { BudgetPanel } from "@/features/plans/components/budget-panel";
import { DecisionsList } from "@/features/plans/components/decisions-list";
import { FlagsSummary } from "@/features/plans/components/flags-summary";
import { PlanActions } from "@/features/plans/components/plan-actions";
import { PlanFacts } from "@/features/plans/components/plan-header";
import { RevisionInputs } from "@/features/plans/components/revision-inputs";
import { RevisionTimeline } from "@/features/plans/components/revision-timeline";
import { StagesTable } from "@/features/plans/components/stages-table";
import { GroupResults } from "@/features/plans/components/group-results";
import { MropeAxes } from "@/features/plans/components/mrope-axes";
import { VerifyStatus } from "@/features/plans/components/verify-status";
import { DecisionDialog } from "@/features/plans/components/decision-dialog";
import { ProbeChecks } from "@/features/plans/components/probe-checks";
import { exportRequestOf } from "@/features/plans/lib/export-request";
import { ExportTargets } from "@/components/export-targets";
import { SignedBlockCautions } from "@/features/plans/components/signed-block-cautions";
import { ExportBlock } from "@/features/workbench";
import { exportsQueries } from "@/lib/api/exports";
import { EvidenceSection } from "@/features/evidence";
import { RevisionCharts } from "./plan-charts";

const flagRows = (content: RevisionContent) => [
  ...content.results.stages.map((result, i) => ({ scope: `Stage ${i + 1}`, result })),
  { scope: "Plan target", result: content.results.final },
];

export function PlanRoute() {
  const id = Number(useParams().id);
  const [search] = useSearchParams();
  const user = useCurrentUser();
  const refreshPlan = useRefreshPlan();
  const [deciding, setDeciding] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const plan = useQuery({ ...plansQueries.detail(id), enabled: Number.isInteger(id) && id > 0 });
  const asked = Number(search.get("revision"));
  const n = plan.data ? (plan.data.revisions.some((r) => r.number === asked) ? asked : plan.data.latestRevision) : 0;
  const revision = useQuery({ ...plansQueries.revision(id, n), enabled: n > 0 });
  const verify = useQuery({ ...plansQueries.verify(id, n), enabled: n > 0 });
  const exportRequest = revision.data ? exportRequestOf(revision.data.content) : null;
  // Shared with the matrix below (same key); its fingerprint stands in until the revision's own has been stored.
  const compiled = useQuery(exportsQueries.detail(exportRequest));
  const revisionFingerprint = revision.data?.rotaryFingerprint ?? compiled.data?.fingerprint ?? null;

  if (plan.isError) {
    return (
      <ErrorView
        title="Plan not found"
        message={plan.error.message}
        testId="plan-error"
        action={
          <Link className="text-seaglass underline underline-offset-4" to={paths.plans()}>
            Back to plans
          </Link>
        }
      />
    );
  }
  if (!plan.data) return <Loading label="Loading plan…" />;
  const p = plan.data;
  const summary = p.revisions.find((r) => r.number === n)!;
  const content = revision.data?.content;

  return (
    <Page title={p.title} lead={p.purpose || undefined}>
      <PlanFacts plan={p} />
      {notice && <Notice tone="success">{notice}</Notice>}
      <VerifyStatus result={verify.data} error={verify.error} />
      <PlanActions
        plan={p}
        revision={summary}
        user={user}
        intact={verify.data?.ok === true}
        onDecide={() => setDeciding(true)}
      />
      {deciding && (
        <DecisionDialog
          target={{
            planId: p.id,
            title: p.title,
            revision: n,
            contentHash: summary.contentHash,
            approvals: summary.approvals,
            requiredApprovals: p.effectiveRequiredApprovals,
          }}
          onClose={() => setDeciding(false)}
          onDecided={(state) => {
            setDeciding(false);
            setNotice(
              state === "approved"
                ? `Revision ${n} passed inspection and is signed.`
                : state === "in_review"
                  ? "Your pass is recorded; the revision waits for more inspectors."
                  : "Sent back to the walk, with your note to its author.",
            );
            void refreshPlan(p.id);
          }}
        />
      )}
      <div className="grid gap-6 lg:grid-cols-[17rem_minmax(0,1fr)]">
        <aside className="flex flex-col gap-3">
          <h2 className="text-title font-semibold">Revisions</h2>
          <RevisionTimeline planId={p.id} revisions={p.revisions} selected={n} />
          {p.revisions.length > 1 && (
            <Link
              className="text-body text-seaglass underline underline-offset-4"
              to={paths.planDiff(p.id, n > 1 ? n - 1 : 1, n > 1 ? n : 2)}
            >
              {ACTION_WORDS.compare}
            </Link>
          )}
        </aside>
        <div className="flex min-w-0 flex-col gap-6" data-testid="revision-view">
          <Panel
            title={`Revision ${n}`}
            aside={
              <span className="text-note text-ink-soft">
                {summary.author?.name} · {formatDateTime(summary.createdAt)}
                {summary.submittedAt && ` · sent to inspection ${formatDateTime(summary.submittedAt)}`}
              </span>
            }
          >
            <LabelledCode label="Content hash" value={summary.contentHash} testId="content-hash" className="mb-4" />
            {revisionFingerprint && (
              <LabelledCode
                label="Rotary fingerprint"
                value={revisionFingerprint}
                testId="revision-fingerprint"
                className="-mt-3 mb-4"
              />
            )}
            {revision.isError && (
              <Notice tone="alert" title="Could not load this revision">
                {revision.error.message}
              </Notice>
            )}
            {content ? (
              <RevisionInputs content={content} adoptedBases={revision.data?.adoptedBases ?? []} />
            ) : (
              !revision.isError && <Loading label="Loading revision…" />
            )}
          </Panel>
          {content && (
            <>
              <Panel title="Stages">
                <StagesTable stages={content.stages} />
              </Panel>
              {content.results.groups && (
                <Panel title="Layer groups">
                  <GroupResults groups={content.results.groups} />
                </Panel>
              )}
              {content.model.mropeSection && (
                <Panel title="Position axes">
                  <MropeAxes content={content} />
                </Panel>
              )}
              <Panel title="Pair flags per stage">
                <FlagsSummary rows={flagRows(content)} pairs={content.results.rotaryDim / 2} />
              </Panel>
              <Panel title="What the engine shows at the plan target">
                <RevisionCharts content={content} />
              </Panel>
              <Panel title="Frozen config block">
                <p className="mb-3 text-body text-ink-soft">
                  The <code>config</code> this revision&apos;s export hands out once signed: the keys its content
                  freezes for the plan target (each stage&apos;s block exports with <code>?stage=n</code>).
                </p>
                <SignedBlockCautions cautions={revision.data?.blockCautions ?? []} />
                <ExportBlock
                  patch={content.results.final.patch}
                  label={`revision ${n}`}
                  heading="Frozen config keys"
                  testId="signed-block"
                />
              </Panel>
              <Panel title="Rigging for each stack">
                <ExportTargets request={exportRequest} />
              </Panel>
              <Panel title="Probe checks">
                <ProbeChecks
                  planId={p.id}
                  revision={n}
                  targetContext={content.targetContext}
                  fingerprint={revisionFingerprint}
                  canUpload={user.roles.includes("researcher") || user.roles.includes("approver")}
                />
              </Panel>
              <Panel title="Acceptance criteria">
                <AcceptanceList criteria={content.acceptance} />
              </Panel>
              {(summary.state === "approved" || summary.state === "superseded") && (
                <Panel title="Evidence and proof">
                  <EvidenceSection
                    planId={p.id}
                    n={n}
                    criteria={content.acceptance}
                    canUpload={
                      user.roles.includes("researcher") && (p.owner?.id === user.id || summary.author?.id === user.id)
                    }
                    canProve={user.roles.includes("approver") && summary.author?.id !== user.id}
                    onProofRecorded={(verdict) => {
                      setNotice(
                        verdict === "proven"
                          ? `Revision ${n} is proven and the decision is signed.`
                          : `Revision ${n} is marked not proven; the reason is signed with it.`,
                      );
                      void refreshPlan(p.id);
                    }}
                  />
                </Panel>
              )}
              {content.budget && (
                <Panel title="Budget">
                  <BudgetPanel budget={content.budget} />
                </Panel>
              )}
            </>
          )}
          <Panel
            title="Decisions"
            aside={
              <span className="text-note text-ink-soft">
                {passesText(summary.approvals, p.effectiveRequiredApprovals)} this round
              </span>
            }
          >
            <DecisionsList
              decisions={summary.decisions}
              currentRound={summary.round}
              contentHash={summary.contentHash}
            />
          </Panel>
        </div>
      </div>
    </Page>
  );
}
