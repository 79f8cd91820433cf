import type { AnalysisRequest, AnalysisResponse, MethodId } from "@shared/schemas/analysis";
import { sig, tokens } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";

/** An answer of POST /api/analyses together with the request that produced it: the figures carry its labels. */
export type Answered = { request: AnalysisRequest; response: AnalysisResponse };

/**
 * Why the figures on screen no longer match the inputs:
 * - "invalid": the inputs cannot be sent (or the server refused them), so the last answer stays;
 * - "updating": new inputs are waiting out the debounce or computing;
 * - null: the figures answer the inputs as they are.
 */
export type Staleness = "invalid" | "updating" | null;

export function staleness(answered: Answered | null, request: AnalysisRequest | null, refused: boolean): Staleness {
  if (!answered) return null;
  if (request === null || refused) return "invalid";
  return JSON.stringify(request) === JSON.stringify(answered.request) ? null : "updating";
}

/** "d = 128 (64 pairs), b = 10,000, L = 4096 → L′ = 32768, s = 8": the inputs an answer was computed for. */
export function describeAnalysis(a: AnalysisResponse): string {
  return `d = ${a.model.rotaryDim} (${a.model.pairs} pairs), b = ${sig(a.model.ropeTheta, 6)}, L = ${a.model.trainedContext} → L′ = ${a.targetContext}, s = ${sig(a.scale, 4)}`;
}

/** Above dimmed figures: they are stale, and for which inputs they were computed. */
export function StaleBanner({ kind, response }: { kind: "invalid" | "updating"; response: AnalysisResponse }) {
  const methods = response.methods.map((m, i) => `${i + 1}. ${METHOD_LABELS[m.method]}`).join(", ");
  return (
    <div
      role="status"
      className="rounded-md border border-hemp/40 bg-hemp-pale px-4 py-3 text-body text-hemp-dark"
      data-testid="stale-banner"
    >
      <p className="font-semibold">
        {kind === "invalid" ? "Stale figures: the inputs above need fixing" : "Stale figures: updating"}
      </p>
      <p className="mt-1">
        Everything below, dimmed, was computed for earlier inputs ({methods}; L′ = {tokens(response.targetContext)}) and
        keeps those methods&apos; names.{" "}
        {kind === "invalid"
          ? "Fix the fields marked in red to compute the rows as they stand."
          : "The new figures replace them as soon as they are ready."}
      </p>
    </div>
  );
}

/**
 * On a stale method card: the row with the same number now asks for something else, so the card must not be read
 * as that row's result.
 */
export function StaleRowNote({ index, shown, now }: { index: number; shown: MethodId; now: MethodId | undefined }) {
  if (now === shown) return null;
  return (
    <p className="text-note font-medium text-hemp-dark" data-testid="stale-row-note">
      {now === undefined
        ? `Row ${index + 1} has been removed; this card is ${METHOD_LABELS[shown]} from the earlier inputs.`
        : `Row ${index + 1} now asks for ${METHOD_LABELS[now]}; this card is still ${METHOD_LABELS[shown]} from the earlier inputs.`}
    </p>
  );
}
