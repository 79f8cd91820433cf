import type { ModelRequest } from "@shared/schemas/budget";
import { parseNumberText } from "@/lib/number-text";

/** The estimator's model: a stored profile, or a shape typed by hand (text as typed, like the sheet). */
export type ModelDraft =
  | { kind: "profile"; modelId: string }
  | {
      kind: "shape";
      parameters: string;
      layers: string;
      attentionHeads: string;
      kvHeads: string;
      headDim: string;
      hiddenSize: string;
      bytesPerElement: string;
    };

export const SHAPE_FIELDS = [
  "parameters",
  "layers",
  "attentionHeads",
  "kvHeads",
  "headDim",
  "hiddenSize",
  "bytesPerElement",
] as const;
export type ShapeField = (typeof SHAPE_FIELDS)[number];

export const emptyShape = (): Extract<ModelDraft, { kind: "shape" }> => ({
  kind: "shape",
  parameters: "",
  layers: "",
  attentionHeads: "",
  kvHeads: "",
  headDim: "",
  hiddenSize: "",
  bytesPerElement: "",
});

/** The request's `model`, or null when a profile is not picked yet. Field checks are left to the shared schema. */
export function modelRequest(draft: ModelDraft): ModelRequest | null {
  if (draft.kind === "profile") {
    const id = parseNumberText(draft.modelId);
    return id === undefined ? null : { modelId: id };
  }
  const shape: Record<string, number> = {};
  for (const field of SHAPE_FIELDS) {
    const v = parseNumberText(draft[field]);
    if (v !== undefined) shape[field] = v;
  }
  return shape as unknown as ModelRequest;
}
