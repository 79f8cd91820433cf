import type { ConfigPatch } from "@shared/schemas/analysis";
import type { ModelSnapshot } from "@shared/schemas/plans";
import { frozenBlockCautions } from "@shared/frozen-block";
import { Notice } from "@/components/notice";

/**
 * What the export envelope's `cautions` say about a revision's signed block, from the same rule (shared/frozen-block.ts):
 * a model with multimodal sections whose block was signed without them.
 */
export function SignedBlockCautions({ model, patch }: { model: ModelSnapshot; patch: ConfigPatch }) {
  const cautions = frozenBlockCautions(model, patch);
  if (!cautions.length) return null;
  return (
    <div className="mb-3 flex flex-col gap-2" data-testid="signed-block-cautions">
      {cautions.map((c) => (
        <Notice key={c.code} tone="alert" title="The signed block lacks the model's sections">
          <p data-code={c.code}>{c.message}</p>
        </Notice>
      ))}
    </div>
  );
}
