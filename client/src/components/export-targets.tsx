import { useQuery } from "@tanstack/react-query";
import type { ExportRequest } from "@shared/schemas/exports";
import { exportsQueries } from "@/lib/api/exports";
import { ConformanceMatrix } from "./conformance-matrix";
import { Loading, Notice } from "./notice";
import { TargetArtifacts } from "./target-artifacts";

/**
 * The plan compiled for every stack (POST /api/exports): the conformance matrix, and unless `matrixOnly`, the
 * export menu with each stack's artifact and the matrix's fingerprint line (`matrixOnly` is the decision dialog, whose
 * signing box prints the fingerprint once). Used by the workbench, the plan page and the decision dialog.
 */
export function ExportTargets({
  request,
  matrixOnly = false,
}: {
  request: ExportRequest | null;
  matrixOnly?: boolean;
}) {
  const compiled = useQuery(exportsQueries.detail(request));
  if (compiled.isError) {
    return (
      <Notice tone="alert" title="Could not compile the plan for the stacks">
        {compiled.error.message}
      </Notice>
    );
  }
  if (!compiled.data) return request ? <Loading label="Compiling for each stack…" /> : null;
  return (
    <div className="flex flex-col gap-4">
      <ConformanceMatrix
        result={compiled.data}
        caption="How each stack reads this plan"
        showFingerprint={!matrixOnly}
      />
      {!matrixOnly && <TargetArtifacts targets={compiled.data.targets} />}
    </div>
  );
}
