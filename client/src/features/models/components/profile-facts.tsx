import type { ModelProfile } from "@shared/schemas/models";
import { formatCount, formatDate } from "@/lib/format";
import { shippedMethod, shippedText } from "@shared/lineage";

/**
 * Lineage: the length the base was pre-trained at and the length the model is served at now. They differ only when
 * the config ships scaling; a plan may extend from either (shared/lineage.ts).
 */
function lineageFacts(model: ModelProfile): [string, string][] {
  const shipped = shippedMethod(model.currentScaling);
  return [
    ["Pre-trained length", `${formatCount(model.pretrainedContext)} tokens`],
    [
      "Served length",
      model.servedContext === model.pretrainedContext
        ? `${formatCount(model.servedContext)} tokens (as trained)`
        : `${formatCount(model.servedContext)} tokens (as shipped${shipped ? `: ${shippedText(shipped)}` : ""})`,
    ],
  ];
}

/** The figures a reader looks for first, with the derived rotary dimension and pairs. */
export function ProfileFacts({ model }: { model: ModelProfile }) {
  const facts: [string, string][] = [
    ["Family", model.family],
    ["Rotary dimension d", `${model.rotaryDim} (head_dim ${model.headDim} × ${model.partialRotaryFactor})`],
    ["Rotating pairs", String(model.pairs)],
    ["Base b (rope_theta)", formatCount(model.ropeTheta)],
    ["Trained context L", `${formatCount(model.trainedContext)} tokens`],
    ...lineageFacts(model),
    [
      "Advertised length",
      model.maxPositionEmbeddings ? `${formatCount(model.maxPositionEmbeddings)} tokens` : "not given",
    ],
    ["Heads", `${model.attentionHeads} attention, ${model.kvHeads} KV`],
    ["Layers", String(model.layers)],
    ["Non-embedding parameters", formatCount(model.parameters)],
    ["Source", model.sourceFileName ? `imported from ${model.sourceFileName}` : "typed in"],
    ["Last changed", formatDate(model.updatedAt)],
  ];
  return (
    <dl className="grid gap-x-6 gap-y-2 text-body sm:grid-cols-[14rem_1fr]" data-testid="profile-facts">
      {facts.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="tabular-nums">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
