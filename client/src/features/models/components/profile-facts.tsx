import type { ModelProfile } from "@shared/schemas/models";
import { formatCount, formatDate } from "@/lib/format";

/** The figures a reader looks for first, with the derived rotary dimension and pairs. */
export function ProfileFacts({ model }: { model: ModelProfile }) {
  const facts: [string, string][] = [
    ["Family", model.family],
    ["Rotary dimension d", `${model.rotaryDim} (head_dim ${model.headDim} × ${model.partialRotaryFactor})`],
    ["Rotating pairs", String(model.pairs)],
    ["Base b (rope_theta)", formatCount(model.ropeTheta)],
    ["Trained context L", `${formatCount(model.trainedContext)} tokens`],
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
