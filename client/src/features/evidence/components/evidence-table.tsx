import type { Evidence } from "@shared/schemas/evidence-api";
import { EVIDENCE_KIND_INFO } from "@shared/schemas/evidence";
import { FramedTable } from "@/components/framed-table";
import { apiPaths } from "@/config/paths";
import { formatDateTime } from "@/lib/format";

/** Every file stored against the revision, with its SHA-256 and a link to the file as uploaded. */
export function EvidenceTable({ planId, n, evidence }: { planId: number; n: number; evidence: Evidence[] }) {
  if (!evidence.length) return <p className="text-body text-ink-soft">No evaluation results uploaded yet.</p>;
  return (
    <FramedTable
      caption="Evaluation results"
      head={
        <>
          <th scope="col">#</th>
          <th scope="col">Kind</th>
          <th scope="col">File</th>
          <th scope="col">Run</th>
          <th scope="col">Uploaded</th>
        </>
      }
    >
      {evidence.map((e) => (
        <tr key={e.id} data-evidence={e.id} className="border-t border-rule align-top [&_td]:px-3 [&_td]:py-2">
          <td>{e.id}</td>
          <td className="text-note">{EVIDENCE_KIND_INFO[e.kind].label}</td>
          <td className="text-note">
            <a
              href={apiPaths.evidenceFile(planId, n, e.id)}
              download={e.fileName}
              className="text-seaglass underline underline-offset-4"
            >
              {e.fileName}
            </a>{" "}
            · {e.rows.length} rows · {e.format === "harness" ? "harness results" : "CSV"}
            <span className="block font-mono text-[0.7rem] break-all text-ink-soft" title="SHA-256 of the file">
              sha256 <span data-testid="evidence-checksum">{e.checksum}</span>
            </span>
          </td>
          <td className="text-note">
            {e.provenance.engine} {e.provenance.engineVersion} · {e.provenance.tokenizer} · truncates{" "}
            {e.provenance.truncation} · {e.provenance.generationBudget} new tokens
          </td>
          <td className="text-note">
            {e.by.name} · {e.via === "token" ? "pipeline token" : "upload"} · {formatDateTime(e.at)}
          </td>
        </tr>
      ))}
    </FramedTable>
  );
}
