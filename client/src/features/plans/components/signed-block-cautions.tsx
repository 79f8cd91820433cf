import type { RevisionResponse } from "@shared/schemas/plans";
import { Notice } from "@/components/notice";

/**
 * What the export envelope's `cautions` say about each block a revision signed (the revision's `blockCautions`, from
 * the same rule, shared/frozen-block.ts): a model with multimodal sections whose plan-target, stage or layer-group block
 * was signed without them.
 */
const titleOf = (c: RevisionResponse["blockCautions"][number]) =>
  c.group !== undefined
    ? `The ${c.group} layer group's signed block lacks the model's sections`
    : c.stage === null
      ? "The signed block lacks the model's sections"
      : `Stage ${c.stage}'s signed block lacks the model's sections`;

export function SignedBlockCautions({ cautions }: { cautions: RevisionResponse["blockCautions"] }) {
  if (!cautions.length) return null;
  return (
    <div className="mb-3 flex flex-col gap-2" data-testid="signed-block-cautions">
      {cautions.map((c) => (
        <Notice key={`${c.group ?? c.stage ?? "target"}-${c.code}`} tone="alert" title={titleOf(c)}>
          <p className="break-words" data-code={c.code} data-stage={c.stage ?? "target"} data-group={c.group}>
            {c.message}
          </p>
        </Notice>
      ))}
    </div>
  );
}
