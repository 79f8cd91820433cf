import type { ExportResponse, TargetExportBody } from "@shared/schemas/exports";
import { relativeErrorText } from "@/lib/format";
import { LabelledCode } from "./labelled-code";

type ConformanceStatus = TargetExportBody["conformance"]["status"];
import { FramedTable } from "./framed-table";

/** The four statuses are fixed by the API; the words under them are ours. */
export const STATUS_WORDS: Record<ConformanceStatus, { label: string; meaning: string; tone: string }> = {
  exact: {
    label: "exact",
    meaning: "reads the plan's frequencies to 1e-12",
    tone: "bg-hemp text-paper border-hemp",
  },
  equivalent: {
    label: "equivalent",
    meaning: "float32 cannot tell it from the plan (≤ 1e-6)",
    tone: "bg-seaglass-pale text-seaglass-dark border-seaglass/40",
  },
  differs: {
    label: "differs",
    meaning: "the stack turns the pairs differently from the plan",
    tone: "bg-signal-pale text-signal-dark border-signal/40",
  },
  unsupported: {
    label: "unsupported",
    meaning: "the stack cannot carry this plan",
    tone: "bg-paper-deep text-ink-soft border-rule-strong",
  },
};

export function StatusBadge({ status }: { status: ConformanceStatus }) {
  const w = STATUS_WORDS[status];
  return (
    <span
      data-status={status}
      title={w.meaning}
      className={`inline-flex items-center rounded-full border px-2 py-0.5 text-note font-medium whitespace-nowrap ${w.tone}`}
    >
      {w.label}
    </span>
  );
}

type GroupRow = NonNullable<TargetExportBody["conformance"]["groups"]>[number];
const GROUP_WORDS: Record<string, string> = { full_attention: "full attention", sliding_attention: "local window" };

/** A layered plan: how the stack reads each layer group, so a stack that gets only some layers right is visible. */
function GroupLines({ groups }: { groups: GroupRow[] }) {
  return (
    <ul className="mt-1 flex flex-col gap-0.5" aria-label="By layer group">
      {groups.map((g) => (
        <li key={g.kind} data-group={g.kind} className="flex flex-wrap items-center gap-1.5">
          <span className="text-ink-soft">{GROUP_WORDS[g.kind] ?? g.kind.replace(/_/g, " ")}:</span>
          <StatusBadge status={g.status} />
          <span className="font-mono">{relativeErrorText(g.maxRelativeError)}</span>
        </li>
      ))}
    </ul>
  );
}

/**
 * Targets × status: how each stack reads the plan once its artifact is applied, with the worst relative error over
 * θ′ and the attention factor, the reason in plain words and the nearest workaround.
 */
/** `showFingerprint` off where the page already prints the fingerprint (the decision dialog's signing box). */
export function ConformanceMatrix({
  result,
  caption,
  showFingerprint = true,
}: {
  result: ExportResponse;
  caption: string;
  showFingerprint?: boolean;
}) {
  return (
    <div className="flex flex-col gap-2" data-testid="conformance-matrix">
      <FramedTable
        caption={caption}
        head={
          <>
            <th scope="col">Stack</th>
            <th scope="col">Status</th>
            <th scope="col">Worst relative error</th>
            <th scope="col">Why</th>
            <th scope="col">Workaround</th>
          </>
        }
      >
        {result.targets.map((t) => (
          <tr key={t.id} data-target={t.id} className="border-t border-rule align-top [&_td]:px-3 [&_td]:py-2">
            <td className="font-medium">{t.label}</td>
            <td>
              <StatusBadge status={t.conformance.status} />
            </td>
            <td className="font-mono text-note whitespace-nowrap">
              {relativeErrorText(t.conformance.maxRelativeError)}
              {t.conformance.worstPair !== null && (
                <span className="text-ink-soft"> (pair {t.conformance.worstPair})</span>
              )}
            </td>
            <td className="text-note">
              {t.conformance.cause || "—"}
              {t.conformance.groups && <GroupLines groups={t.conformance.groups} />}
            </td>
            <td className="text-note">{t.conformance.workaround || "—"}</td>
          </tr>
        ))}
      </FramedTable>
      {showFingerprint && (
        <LabelledCode label="Rotary fingerprint" value={result.fingerprint} testId="rotary-fingerprint" />
      )}
    </div>
  );
}
