import { rotaryDimension } from "@shared/schemas/analysis";

/** The derived rotary dimension d = headDim × partialRotaryFactor and its d/2 pairs, live as the user types. */
export function RotaryShapeSummary({
  headDim,
  partialRotaryFactor,
}: {
  headDim: unknown;
  partialRotaryFactor: unknown;
}) {
  const h = Number(headDim);
  const f =
    partialRotaryFactor === undefined || partialRotaryFactor === null || partialRotaryFactor === ""
      ? 1
      : Number(partialRotaryFactor);
  const d = Number.isFinite(h) && Number.isFinite(f) ? rotaryDimension({ headDim: h, partialRotaryFactor: f }) : null;
  return (
    <p
      className={`rounded-md border px-3 py-2 text-body ${d !== null ? "border-seaglass/30 bg-seaglass-pale/60" : "border-signal/40 bg-signal-pale/60"}`}
      data-testid="rotary-summary"
      aria-live="polite"
    >
      {d !== null ? (
        <>
          Rotary dimension <strong>d = {d}</strong> (head_dim {h} × rotary fraction {f}), so{" "}
          <strong>{d / 2} rotating pairs</strong> per head.
        </>
      ) : (
        <span className="text-signal-dark">
          head_dim × partial_rotary_factor = {Number.isFinite(h * f) ? Number((h * f).toPrecision(6)) : "?"} is not a
          positive even whole number, so it cannot be a rotary dimension.
        </span>
      )}
    </p>
  );
}
