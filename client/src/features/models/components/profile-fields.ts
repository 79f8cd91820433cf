import type { ModelProfileInput } from "@shared/schemas/models";

type Key = Exclude<keyof ModelProfileInput, "currentScaling">;

export type ProfileFieldSpec = {
  name: Key;
  label: string;
  kind: "text" | "number" | "optional-number" | "long-text";
  hint?: string;
  step?: string;
};

/**
 * The editable fields of a profile, in reading order, labelled with the config.json key they come from
 * so an imported value can be traced back to the file.
 */
export const PROFILE_SECTIONS: { title: string; fields: ProfileFieldSpec[] }[] = [
  {
    title: "Identity",
    fields: [
      { name: "name", label: "Name", kind: "text" },
      { name: "family", label: "Family (model_type)", kind: "text" },
    ],
  },
  {
    title: "Rotary shape",
    fields: [
      {
        name: "headDim",
        label: "Head dimension (head_dim)",
        kind: "number",
        hint: "Per attention head; may differ from hidden_size / heads.",
      },
      {
        name: "partialRotaryFactor",
        label: "Rotary fraction (partial_rotary_factor)",
        kind: "number",
        step: "any",
        hint: "1 when the whole head rotates.",
      },
      { name: "ropeTheta", label: "Base b (rope_theta)", kind: "number", step: "any" },
      {
        name: "trainedContext",
        label: "Trained context L (tokens)",
        kind: "number",
        hint: "The pre-extension length: original_max_position_embeddings when the config already carries scaling.",
      },
      {
        name: "maxPositionEmbeddings",
        label: "Advertised length (max_position_embeddings)",
        kind: "optional-number",
        hint: "Optional.",
      },
      {
        name: "servedContext",
        label: "Served length (tokens)",
        kind: "optional-number",
        hint: "The length the model is served at now, when it already ships scaling; empty: the advertised length.",
      },
    ],
  },
  {
    title: "Size",
    fields: [
      { name: "layers", label: "Layers (num_hidden_layers)", kind: "number" },
      { name: "attentionHeads", label: "Attention heads (num_attention_heads)", kind: "number" },
      {
        name: "kvHeads",
        label: "KV heads (num_key_value_heads)",
        kind: "number",
        hint: "Fewer than attention heads when heads share keys and values.",
      },
      { name: "hiddenSize", label: "Hidden size (hidden_size)", kind: "number" },
      {
        name: "parameters",
        label: "Non-embedding parameters",
        kind: "number",
        step: "any",
        hint: "Drives every FLOP figure of a budget.",
      },
      {
        name: "parametersTotal",
        label: "Total parameters",
        kind: "optional-number",
        step: "any",
        hint: "Optional; at least the non-embedding count.",
      },
      {
        name: "bytesPerElement",
        label: "Bytes per element",
        kind: "number",
        step: "any",
        hint: "2 for bfloat16 / float16, 4 for float32.",
      },
    ],
  },
  { title: "Where it came from", fields: [{ name: "provenance", label: "Provenance", kind: "long-text" }] },
];

export const PROFILE_FIELD_NAMES = PROFILE_SECTIONS.flatMap((s) => s.fields.map((f) => f.name));

/** What an empty number box means: required fields become undefined (reported as missing), optional ones null. */
export const toNumber = (optional: boolean) => (raw: unknown) => {
  if (raw === "" || raw === null || raw === undefined) return optional ? null : undefined;
  return typeof raw === "number" ? raw : Number(raw);
};
