import { Fragment, useRef, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import type { ConformanceCheck, ProbeGroupCheck } from "@shared/schemas/conformance";
import { Button } from "@/components/button";
import { layerRuns } from "@/components/layer-groups-table";
import { FramedTable } from "@/components/framed-table";
import { Chip, Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { formatDateTime, relativeErrorText } from "@/lib/format";
import { useCopyText } from "@/lib/use-copy-text";
import { plansQueries } from "../api/queries";
import { useUploadProbe } from "../api/conformance-checks";

type ProbeChecksProps = {
  planId: number;
  revision: number;
  targetContext: number;
  /** the revision's rotary fingerprint, when known */
  fingerprint: string | null;
  /** researchers and approvers may record a probe result */
  canUpload: boolean;
};

const probeLine = (targetContext: number, fingerprint: string | null) =>
  `python3 tools/probe/ropewalk_probe.py --config path/to/config.json --length ${targetContext}` +
  (fingerprint ? ` --fingerprint ${fingerprint}` : "") +
  " --out probe.json";

function Result({ passed }: { passed: boolean }) {
  return (
    <span data-passed={passed}>
      <Chip tone={passed ? "seaglass" : "signal"}>{passed ? "holds" : "slips"}</Chip>
    </span>
  );
}

/** A layered check's result per layer group: which layers, whether they hold, and why not. */
function GroupRows({ check, groups }: { check: number; groups: ProbeGroupCheck[] }) {
  return (
    <tr data-check-groups={check} className="align-top [&>td]:px-3 [&>td]:pb-3">
      <td />
      <td colSpan={5}>
        <table className="w-full text-note" aria-label={`Layer groups of check ${check}`}>
          <thead className="text-left text-ink-soft">
            <tr className="[&_th]:pr-3 [&_th]:font-semibold">
              <th scope="col">Layer group</th>
              <th scope="col">Layers</th>
              <th scope="col">Result</th>
              <th scope="col">Worst relative error</th>
              <th scope="col">Why</th>
            </tr>
          </thead>
          <tbody>
            {groups.map((g) => (
              <tr key={g.kind} data-group={g.kind} className="border-t border-rule [&_td]:py-1 [&_td]:pr-3">
                <td className="font-mono">{g.kind}</td>
                <td>{layerRuns(g.layers)}</td>
                <td>
                  <Result passed={g.passed} />
                </td>
                <td className="font-mono whitespace-nowrap">
                  {relativeErrorText(g.maxRelativeError)}
                  {g.worstPair !== null && <span className="text-ink-soft"> (pair {g.worstPair})</span>}
                </td>
                <td>{g.cause || "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </td>
    </tr>
  );
}

function ChecksTable({ checks }: { checks: ConformanceCheck[] }) {
  return (
    <FramedTable
      caption="Probe checks"
      head={
        <>
          <th scope="col">Revision</th>
          <th scope="col">Result</th>
          <th scope="col">Library</th>
          <th scope="col">Worst relative error</th>
          <th scope="col">Why</th>
          <th scope="col">Recorded</th>
        </>
      }
    >
      {checks.map((c) => (
        <Fragment key={c.id}>
          <tr data-check={c.id} className="border-t border-rule align-top [&>td]:px-3 [&>td]:py-2">
            <td>{c.revision}</td>
            <td>
              <Result passed={c.passed} />
            </td>
            <td className="text-note">
              {c.library} {c.libraryVersion} · {c.ropeType} at {c.runningLength}
              {c.fingerprintMatches === false && (
                <span className="block text-signal-dark">run for another revision&apos;s fingerprint</span>
              )}
            </td>
            <td className="font-mono text-note whitespace-nowrap">
              {relativeErrorText(c.maxRelativeError)}
              {c.worstPair !== null && <span className="text-ink-soft"> (pair {c.worstPair})</span>}
            </td>
            <td className="text-note">{c.cause || "—"}</td>
            <td className="text-note">
              {c.by.name} · {c.via === "token" ? "token" : "upload"} · {formatDateTime(c.at)}
            </td>
          </tr>
          {c.groups && <GroupRows check={c.id} groups={c.groups} />}
        </Fragment>
      ))}
    </FramedTable>
  );
}

/**
 * Probe checks: the command that reads what the user's installed library builds for their config, the upload of its
 * JSON, and every check recorded on the plan. A check holds when θ′ and the attention factor agree at float32 tolerance.
 */
export function ProbeChecks({ planId, revision, targetContext, fingerprint, canUpload }: ProbeChecksProps) {
  const checks = useQuery(plansQueries.conformanceChecks(planId));
  const upload = useUploadProbe();
  const file = useRef<HTMLInputElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [recorded, setRecorded] = useState<ConformanceCheck | null>(null);
  const { copied, copy } = useCopyText();
  const line = probeLine(targetContext, fingerprint);

  const send = async () => {
    setProblem(null);
    setRecorded(null);
    const chosen = file.current?.files?.[0];
    if (!chosen) return setProblem("Choose the probe's JSON file first.");
    let probe: unknown;
    try {
      probe = JSON.parse(await chosen.text());
    } catch {
      return setProblem(`${chosen.name} is not JSON; upload the file the probe wrote with --out.`);
    }
    upload.mutate(
      { planId, n: revision, probe },
      {
        onSuccess: (c) => setRecorded(c),
        onError: (e) => {
          const fields = isApiError(e) && e.fields ? Object.entries(e.fields) : [];
          setProblem(
            fields.length
              ? `Not recorded: ${fields.map(([k, v]) => `${k}: ${v}`).join("; ")}`
              : `Not recorded: ${e.message}`,
          );
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-4" data-testid="probe-checks">
      <div className="flex flex-col gap-1">
        <div className="flex items-center justify-between gap-2">
          <span className="text-note font-semibold text-ink-soft">
            Run the probe where the model is tuned or served (tools/probe/README.md)
          </span>
          <span className="flex items-center gap-2">
            {copied === "yes" && (
              <span className="text-note text-seaglass-dark" role="status">
                Copied
              </span>
            )}
            <Button variant="secondary" size="sm" onClick={() => copy(line)} aria-label="Copy the probe command">
              Copy
            </Button>
          </span>
        </div>
        <pre className="overflow-auto rounded-md border border-rule bg-paper-deep px-3 py-2 text-note whitespace-pre-wrap">
          {line}
        </pre>
      </div>
      {canUpload && (
        <div className="flex flex-wrap items-center gap-3">
          <label className="text-body">
            Probe result for revision {revision}{" "}
            <input ref={file} type="file" accept="application/json,.json" className="text-note" />
          </label>
          <Button size="sm" onClick={() => void send()} busy={upload.isPending}>
            Record the check
          </Button>
        </div>
      )}
      {problem && <Notice tone="alert">{problem}</Notice>}
      {recorded && (
        <Notice tone={recorded.passed ? "success" : "alert"}>
          {recorded.passed
            ? `Recorded: the library's frequencies hold to the revision's (worst relative error ${recorded.maxRelativeError?.toExponential(2)}).`
            : `Recorded: the library's frequencies slip from the revision's. ${recorded.cause}`}
        </Notice>
      )}
      {checks.isError && <Notice tone="alert">{checks.error.message}</Notice>}
      {checks.data &&
        (checks.data.checks.length ? (
          <ChecksTable checks={checks.data.checks} />
        ) : (
          <p className="text-body text-ink-soft">No probe checks recorded yet.</p>
        ))}
    </div>
  );
}
