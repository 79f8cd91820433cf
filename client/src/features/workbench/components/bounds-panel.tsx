import { useQuery } from "@tanstack/react-query";
import type { AnalysisResponse, ExtrapolationBound } from "@shared/schemas/analysis";
import { supportedLengthsQuery } from "../api/supported-lengths";
import { HowComputed } from "../explain/how-computed";
import { sig, tokens } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";
import { SmallestBase } from "./smallest-base";

function BoundLine({ bound, who }: { bound: ExtrapolationBound; who: string }) {
  return (
    <li>
      {who}: base {sig(bound.base, 5)} is {bound.baseAboveCritical ? "above" : "not above"} the critical base, so the
      bound is <strong className="tabular-nums">{tokens(bound.bound)} tokens</strong>
      {bound.baseAboveCritical
        ? ` (T_extra = 2π·β^(d_extra/d) = ${tokens(bound.tExtra)})`
        : " (the tuning length itself)"}
      .
    </li>
  );
}

/** Model-level bounds: critical dimension, extrapolation bound, supported length of each base, smallest base for the target. */
export function BoundsPanel({ analysis }: { analysis: AnalysisResponse }) {
  const d = analysis.model.rotaryDim,
    L = analysis.model.trainedContext,
    target = analysis.targetContext;
  const sources = [{ base: analysis.model.ropeTheta, who: "Current base" }];
  analysis.methods.forEach((m, i) => {
    if (m.effectiveBase !== null && !sources.some((s) => s.base === m.effectiveBase))
      sources.push({ base: m.effectiveBase, who: `${i + 1}. ${METHOD_LABELS[m.method]}` });
  });
  const lengths = useQuery(
    supportedLengthsQuery(
      d,
      sources.map((s) => s.base),
    ),
  );
  const quick = analysis.baseSupport;

  return (
    <div className="flex flex-col gap-5 text-body">
      <section className="flex flex-col gap-1" aria-label="Critical dimension">
        <h3 className="font-semibold">Critical dimension</h3>
        <p>
          <strong className="tabular-nums">d_extra = {analysis.criticalDimension}</strong> of d = {d}: the first{" "}
          {analysis.criticalDimension / 2} pairs complete a period inside L = {tokens(L)}; the other{" "}
          {(d - analysis.criticalDimension) / 2} pairs never did.
        </p>
        <HowComputed topics={["criticalDimension"]} />
      </section>

      <section className="flex flex-col gap-1" aria-label="Extrapolation bound">
        <h3 className="font-semibold">Critical base and extrapolation bound</h3>
        <p>
          Tuning at L′ = {tokens(target)}, the critical base is{" "}
          <strong className="tabular-nums">β₀ = {sig(analysis.criticalBase, 5)}</strong>.
        </p>
        <ul className="list-disc pl-5">
          <BoundLine bound={analysis.extrapolationBound} who="Current base" />
          {analysis.methods.map(
            (m, i) =>
              m.extrapolationBound &&
              m.effectiveBase !== analysis.model.ropeTheta && (
                <BoundLine key={i} bound={m.extrapolationBound} who={`${i + 1}. ${METHOD_LABELS[m.method]}`} />
              ),
          )}
        </ul>
        <p className="text-note text-ink-soft">Assumes the model is tuned at the target length with that base.</p>
        <HowComputed topics={["extrapolationBound"]} />
      </section>

      <section className="flex flex-col gap-2" aria-label="Supported length">
        <h3 className="font-semibold">Supported length of each base</h3>
        <table className="w-full max-w-2xl border-collapse text-left">
          <thead className="text-note text-ink-soft uppercase">
            <tr>
              <th className="py-1 pr-3">Base</th>
              <th className="py-1 pr-3">From</th>
              <th className="py-1 pr-3">Supported length (tokens)</th>
              <th className="py-1">Covers L′?</th>
            </tr>
          </thead>
          <tbody data-testid="supported-lengths">
            {sources.map((s, k) => {
              const full = lengths.data?.[k];
              const value = full
                ? full.supportedLength === null
                  ? `beyond ${tokens(full.maxLength)}`
                  : tokens(full.supportedLength)
                : k === 0 && quick.supportedLength !== null
                  ? tokens(quick.supportedLength)
                  : lengths.isError
                    ? "not available"
                    : "scanning…";
              const covers = full
                ? full.supportedLength === null || full.supportedLength >= target
                : k === 0
                  ? quick.supportsTarget
                  : null;
              return (
                <tr key={s.base} className="border-t border-rule/70">
                  <td className="py-1 pr-3 tabular-nums">{sig(s.base, 6)}</td>
                  <td className="py-1 pr-3">{s.who}</td>
                  <td className="py-1 pr-3 tabular-nums">{value}</td>
                  <td className="py-1">
                    {covers === null ? "…" : covers ? "yes" : <span className="font-medium text-signal">no</span>}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        {lengths.isError && <p className="text-note text-signal">{lengths.error.message}</p>}
        <p className="text-note text-ink-soft">Scanned up to 2²⁴ positions for d = {d}.</p>
        <SmallestBase rotaryDim={d} targetContext={target} currentBase={analysis.model.ropeTheta} />
        <HowComputed topics={["baseBound"]} />
      </section>
    </div>
  );
}
