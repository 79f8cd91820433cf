import type { ReactNode } from "react";
import type { AdoptedBaseSupport, RevisionContent } from "@shared/schemas/plans";
import { DEFAULT_BANDS } from "@shared/schemas/analysis";
import { formatCount, formatGrouped, sig3 } from "@/lib/format";
import { describeParams, methodLabel } from "../lib/method-table";

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <>
      <dt className="text-ink-soft">{label}</dt>
      <dd>{children}</dd>
    </>
  );
}

/** What the revision was drafted on and for: the frozen model values, the target and the method. */
export function RevisionInputs({
  content,
  adoptedBases,
}: {
  content: RevisionContent;
  adoptedBases: readonly AdoptedBaseSupport[];
}) {
  const { model, results } = content;
  const bands = content.bands ?? DEFAULT_BANDS;
  const scale = content.targetContext / model.trainedContext;
  const support = results.baseSupport;
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <dl
        className="grid grid-cols-[11rem_minmax(0,1fr)] gap-x-3 gap-y-1.5 text-body [overflow-wrap:anywhere]"
        aria-label="Model as frozen in this revision"
      >
        <Row label="Model">
          {model.name} <span className="text-ink-soft">({model.family})</span>
        </Row>
        <Row label="Trained context">{formatCount(model.trainedContext)} tokens</Row>
        <Row label="Base (rope_theta)">{formatGrouped(model.ropeTheta)}</Row>
        <Row label="Head dimension">
          {model.headDim}
          {model.partialRotaryFactor !== 1 && ` × ${model.partialRotaryFactor} rotary`}
        </Row>
        <Row label="Rotary dimension">
          {results.rotaryDim} ({results.rotaryDim / 2} pairs)
        </Row>
        <Row label="Critical dimension">
          {results.criticalDimension} <span className="text-note text-ink-soft">(Liu et al. 2023, Lemma 1)</span>
        </Row>
        <Row label={adoptedBases.length ? "Model's base supports" : "Base supports"}>
          {support.supportedLength === null
            ? support.complete
              ? "every length checked"
              : `no failure below ${formatCount(support.checkedUpTo)} tokens (scan incomplete)`
            : `${formatCount(support.supportedLength)} tokens`}{" "}
          <span className="text-note text-ink-soft">(Men et al. 2024 bound)</span>
        </Row>
      </dl>
      <dl
        className="grid grid-cols-[11rem_minmax(0,1fr)] gap-x-3 gap-y-1.5 text-body [overflow-wrap:anywhere]"
        aria-label="Target and method"
      >
        <Row label="Target context">
          {formatCount(content.targetContext)} tokens{" "}
          <span className="text-ink-soft">(× {sig3(scale)} the trained window)</span>
        </Row>
        {adoptedBases.map((b) => (
          <Row key={b.base} label={`New base ${formatGrouped(b.base)}`}>
            <span data-testid="adopted-base-support">
              {b.reachesTarget
                ? `reaches ${formatGrouped(b.target)} tokens: no failure below it (complete scan)`
                : `falls short: fails at ${formatGrouped(b.supportedLength ?? 0)} tokens, below ${formatGrouped(b.target)}`}
            </span>{" "}
            <span className="text-note text-ink-soft">(Men et al. 2024 bound)</span>
          </Row>
        ))}
        <Row label="Method">{methodLabel(content.method.method)}</Row>
        <Row label="Parameters">{describeParams(content.method)}</Row>
        <Row label="Band edges">
          α {bands.alpha}, β {bands.beta} rotations{" "}
          <span className="text-note text-ink-soft">{content.bands ? "" : "(defaults)"}</span>
        </Row>
        <Row label="Attention factor">×{sig3(results.final.attentionFactor)}</Row>
        <Row label="Engine">{content.engineVersion}</Row>
      </dl>
      {content.notes && (
        <div className="md:col-span-2">
          <h3 className="text-note font-semibold tracking-wide text-ink-soft uppercase">Notes</h3>
          <p className="mt-1 whitespace-pre-wrap text-body">{content.notes}</p>
        </div>
      )}
    </div>
  );
}
