import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import type { EvidenceKind } from "@shared/schemas/evidence";
import type { ProofState } from "@shared/schemas/evidence-api";
import { Button } from "@/components/button";
import { Loading, Notice } from "@/components/notice";
import { evidenceQuery } from "../api/evidence";
import { isFileKind } from "../lib/kinds";
import type { CriterionOptions } from "../lib/units";
import { CriteriaVerdicts } from "./criteria-verdicts";
import { EvidenceCharts } from "./evidence-charts";
import { EvidenceTable } from "./evidence-table";
import { ProofDialog, type ProofTarget } from "./proof-dialog";
import { ProofRecord } from "./proof-record";
import { UploadForm } from "./upload-form";

type Criterion = CriterionOptions & { kind?: EvidenceKind; contextLength: number };

type EvidenceSectionProps = {
  planId: number;
  n: number;
  /** the revision's acceptance criteria as stored (their options say what each figure means) */
  criteria: Criterion[];
  /** researchers on the plan (its owner or the revision's author) */
  canUpload: boolean;
  /** approvers who did not author the revision */
  canProve: boolean;
  onProofRecorded: (verdict: ProofState) => void;
};

const h3 = "text-body font-semibold";

/**
 * Evidence on an approved revision: proof state, each criterion's verdict, the charts the results call for, the files
 * with their checksums, the upload form for researchers on the plan, and the proof buttons for approvers.
 */
export function EvidenceSection({ planId, n, criteria, canUpload, canProve, onProofRecorded }: EvidenceSectionProps) {
  const list = useQuery(evidenceQuery(planId, n));
  const [proving, setProving] = useState<ProofTarget | null>(null);
  if (list.isError)
    return (
      <Notice tone="alert" title="Could not load the evidence">
        {list.error.message}
      </Notice>
    );
  if (!list.data) return <Loading label="Loading evidence…" />;
  const data = list.data;
  const approved = data.state === "approved";
  const open = data.criteria.filter((c) => c.status !== "pass");
  const allPass = data.criteria.length > 0 && open.length === 0;
  const target = (verdict: ProofState): ProofTarget => ({
    planId,
    revision: n,
    contentHash: data.contentHash,
    evidenceIds: data.evidence.map((e) => e.id),
    allPass,
    open: data.criteria.length
      ? open.map((c) => `#${c.index + 1} (${c.status.replace("_", " ")})`).join(", ")
      : "none stated",
    verdict,
  });
  const fileKind = criteria.map((c) => c.kind).find(isFileKind);

  return (
    <div className="flex min-w-0 flex-col gap-6" data-testid="evidence-section">
      <section className="flex flex-col gap-2" aria-label="Proof">
        <h3 className={h3}>Proof</h3>
        <ProofRecord proof={data.proof} proofs={data.proofs} />
        {canProve && approved && (
          <div className="flex flex-wrap items-center gap-2">
            <Button
              size="sm"
              disabled={!allPass}
              onClick={() => setProving(target("proven"))}
              title={allPass ? undefined : "Every criterion must hold before the revision can be proven"}
            >
              Mark proven
            </Button>
            <Button size="sm" variant="danger" onClick={() => setProving(target("unproven"))}>
              Mark not proven
            </Button>
            {!allPass && (
              <span className="text-note text-ink-soft">
                Proven opens once every criterion holds ({target("proven").open} do not).
              </span>
            )}
          </div>
        )}
      </section>
      {proving && (
        <ProofDialog
          target={proving}
          onClose={() => setProving(null)}
          onDecided={(verdict) => {
            setProving(null);
            onProofRecorded(verdict);
          }}
        />
      )}
      <section className="flex flex-col gap-2" aria-label="Criteria against the evidence">
        <h3 className={h3}>Criteria against the evidence</h3>
        <CriteriaVerdicts verdicts={data.criteria} options={criteria} evidence={data.evidence} />
      </section>
      <EvidenceCharts data={data} />
      <section className="flex flex-col gap-2" aria-label="Evaluation results">
        <h3 className={h3}>Evaluation results</h3>
        <EvidenceTable planId={planId} n={n} evidence={data.evidence} />
      </section>
      {canUpload && approved && data.rotaryFingerprint && (
        <section className="flex flex-col gap-2" aria-label="Upload results">
          <h3 className={h3}>Upload results</h3>
          <UploadForm
            planId={planId}
            n={n}
            fingerprint={data.rotaryFingerprint}
            defaultKind={fileKind ?? "passkey"}
            lengths={[data.trainedContext, ...criteria.map((c) => c.contextLength)]}
          />
        </section>
      )}
    </div>
  );
}
