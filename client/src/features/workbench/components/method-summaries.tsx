import type { AnalysisResponse, MethodId } from "@shared/schemas/analysis";
import { methodColour } from "../charts/palette";
import { HowComputed } from "../explain/how-computed";
import { sig } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";
import { ExportBlock } from "./export-block";
import { StaleRowNote } from "./stale-results";

/** One card per method: attention factor, how many pairs each flag hit, the engine's notes, and the export block. */
export function MethodSummaries({
  analysis,
  currentMethods = null,
}: {
  analysis: AnalysisResponse;
  /** Set while the figures are stale: the methods the input rows ask for now. */
  currentMethods?: MethodId[] | null;
}) {
  const n = analysis.model.pairs;
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      {analysis.methods.map((m, i) => (
        <article
          key={i}
          className="flex min-w-0 flex-col gap-3 rounded-md border border-rule bg-white/50 p-4"
          style={{ borderTop: `4px solid ${methodColour(i)}` }}
          aria-label={`Method ${i + 1}: ${METHOD_LABELS[m.method]}`}
        >
          <h3 className="text-lead font-semibold">
            {i + 1}. {METHOD_LABELS[m.method]}
          </h3>
          {currentMethods && <StaleRowNote index={i} shown={m.method} now={currentMethods[i]} />}
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-body">
            <dt className="text-ink-soft">Attention factor a</dt>
            <dd className="tabular-nums">
              {sig(m.attentionFactor, 5)} (logits scale by a² = {sig(m.attentionFactor ** 2, 5)})
            </dd>
            {m.effectiveBase !== null && (
              <>
                <dt className="text-ink-soft">Effective base</dt>
                <dd className="tabular-nums">{sig(m.effectiveBase, 6)}</dd>
              </>
            )}
            <dt className="text-ink-soft">Reaches unseen angles</dt>
            <dd className="tabular-nums">
              {m.summary.unseenAnglesPairs} of {n} pairs
            </dd>
            <dt className="text-ink-soft">Resolution compressed</dt>
            <dd className="tabular-nums">
              {m.summary.compressedResolutionPairs} of {n} pairs
            </dd>
            <dt className="text-ink-soft">Longer than trained window</dt>
            <dd className="tabular-nums">
              {m.summary.exceedsTrainedWindowPairs} of {n} pairs
            </dd>
          </dl>
          {m.notes.length > 0 && (
            <ul className="list-disc pl-5 text-note text-ink-soft">
              {m.notes.map((note) => (
                <li key={note}>{note}</li>
              ))}
            </ul>
          )}
          <ExportBlock patch={m.ropeScaling} label={METHOD_LABELS[m.method]} />
          <HowComputed methods={[m.method]} topics={["flags"]} />
        </article>
      ))}
    </div>
  );
}
