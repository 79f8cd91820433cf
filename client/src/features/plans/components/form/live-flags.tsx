import { useQuery } from "@tanstack/react-query";
import { useFormContext, useWatch } from "react-hook-form";
import { lengthSchema, methodParamsSchema, bandsSchema, type AnalysisRequest } from "@shared/schemas/analysis";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { formatCount, sig3 } from "@/lib/format";
import { useDebounced } from "@/lib/use-debounced";
import { analysesQueries } from "@/lib/api/analyses";
import type { RevisionForm } from "@/features/plans/lib/form-values";
import { formatPairRanges } from "@/features/plans/lib/pair-ranges";
import { FLAG_INFO } from "../flags-summary";

/** What the analysis is run on: a stored profile by id, or the shape frozen in the revision being edited. */
export type AnalysisModel = AnalysisRequest["model"];

const DEBOUNCE_MS = 400;

/** The request for the current values, or null while they are not yet a valid target and method. */
function requestOf(
  model: AnalysisModel | null,
  target: unknown,
  method: unknown,
  bands: unknown,
): AnalysisRequest | null {
  if (!model) return null;
  const t = lengthSchema.safeParse(target);
  const m = methodParamsSchema.safeParse(method);
  const b = bands === undefined ? undefined : bandsSchema.safeParse(bands);
  if (!t.success || !m.success || (b && !b.success)) return null;
  return { model, targetContext: t.data, methods: [m.data], ...(b?.success ? { bands: b.data } : {}) };
}

/**
 * Re-runs the engine for the plan's target and method a moment after the last edit, and shows how many pairs
 * each flag catches. Nothing is saved; the stored figures are recomputed by the server on save.
 */
export function LiveFlags({ model }: { model: AnalysisModel | null }) {
  const { control } = useFormContext<RevisionForm>();
  const [target, method, bands] = useWatch({
    control,
    name: ["revision.targetContext", "revision.method", "revision.bands"],
  });
  const current = requestOf(model, target, method, bands);
  const settled = useDebounced(current, DEBOUNCE_MS);
  const analysis = useQuery(analysesQueries.detail(settled));

  return (
    <section
      aria-label="Live analysis"
      aria-live="polite"
      className="flex flex-col gap-2 rounded-md border border-seaglass/40 bg-seaglass-pale/40 p-4"
    >
      <h3 className="text-body font-semibold">Live check at the plan target</h3>
      {!model && <p className="text-note text-ink-soft">Pick a model to see the engine’s figures.</p>}
      {model && !current && <p className="text-note text-ink-soft">Waiting for a valid target and method…</p>}
      {analysis.isError && (
        <Notice tone="alert" title="The engine refused these values">
          {isApiError(analysis.error) && analysis.error.fields
            ? Object.entries(analysis.error.fields).map(([field, message]) => (
                <p key={field}>
                  {field.replace(/^methods\.0\./, "method ")}: {message}
                </p>
              ))
            : analysis.error.message}
        </Notice>
      )}
      {analysis.data && current && (
        <div
          className={`flex flex-col gap-2 ${analysis.isFetching || JSON.stringify(current) !== JSON.stringify(settled) ? "opacity-60" : ""}`}
          data-testid="live-flags"
        >
          <p className="text-body">
            {formatCount(analysis.data.targetContext)} tokens is ×{sig3(analysis.data.scale)} the trained window;{" "}
            {analysis.data.model.pairs} pairs; attention factor ×{sig3(analysis.data.methods[0].attentionFactor)};
            rope_type <code>{analysis.data.methods[0].ropeScaling.rope_scaling?.rope_type ?? "none"}</code>.
          </p>
          <ul className="grid gap-1 text-body sm:grid-cols-3">
            {(["unseenAngles", "compressedResolution", "exceedsTrainedWindow"] as const).map((flag) => {
              const pairs = analysis.data.methods[0].pairs.filter((p) => p[flag]).map((p) => p.index);
              return (
                <li key={flag} className="rounded border border-rule bg-white/60 px-2 py-1">
                  <span className="font-semibold">{FLAG_INFO[flag].label}</span>: {pairs.length} pairs
                  {pairs.length > 0 && <span className="block text-note text-ink-soft">{formatPairRanges(pairs)}</span>}
                </li>
              );
            })}
          </ul>
          {analysis.data.methods[0].notes.length > 0 && (
            <ul className="list-disc pl-5 text-note text-ink-soft">
              {analysis.data.methods[0].notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
