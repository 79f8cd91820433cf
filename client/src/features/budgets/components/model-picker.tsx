import type { ReactNode } from "react";
import { useId } from "react";
import { formatCount } from "@/lib/format";
import type { ModelProfile } from "@shared/schemas/models";
import { emptyShape, type ModelDraft, type ShapeField } from "../lib/model-draft";
import { Radio } from "@/components/radio";
import { SheetInput } from "./sheet-input";
import { ChoiceField } from "@/components/field";

const SHAPE_LABELS: Record<ShapeField, { label: string; hint?: string }> = {
  parameters: { label: "Parameters", hint: "Non-embedding count, for 6N and weight memory" },
  layers: { label: "Layers" },
  attentionHeads: { label: "Attention heads" },
  kvHeads: { label: "KV heads", hint: "Must divide the attention heads" },
  headDim: { label: "Head dimension" },
  hiddenSize: { label: "Hidden size", hint: "Blank: heads × head dimension" },
  bytesPerElement: { label: "Bytes per element", hint: "Blank: 2 (bf16)" },
};

/** Only the fields the estimator reads from a stored profile (GET /api/models, read through lib/api/models). */
export type ModelChoice = Pick<
  ModelProfile,
  | "id"
  | "name"
  | "family"
  | "parameters"
  | "layers"
  | "attentionHeads"
  | "kvHeads"
  | "headDim"
  | "hiddenSize"
  | "bytesPerElement"
  | "trainedContext"
  | "retiredAt"
>;

type Props = {
  value: ModelDraft;
  onChange: (next: ModelDraft) => void;
  profiles: ModelChoice[];
  issues: Record<string, string>;
  /** The search box that narrows `profiles` (the server pages them), shown above the profile picker. */
  search?: ReactNode;
};

/** A stored profile, or a model shape typed by hand. */
export function ModelPicker({ value, onChange, profiles, issues, search }: Props) {
  const uid = useId();
  const radio = (kind: ModelDraft["kind"], label: string) => (
    <Radio
      name={`${uid}-model`}
      checked={value.kind === kind}
      onChange={() => onChange(kind === "profile" ? { kind: "profile", modelId: "" } : emptyShape())}
      label={label}
    />
  );
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="sr-only">Model</legend>
      <div className="flex flex-wrap gap-4">
        {radio("profile", "A stored profile")}
        {radio("shape", "Type a shape")}
      </div>
      {value.kind === "profile" && search}
      {value.kind === "profile" ? (
        <ChoiceField
          className="max-w-xl"
          label="Model profile"
          value={value.modelId}
          onChange={(modelId) => onChange({ kind: "profile", modelId })}
          emptyLabel="Pick a profile…"
          options={profiles
            .filter((p) => !p.retiredAt || String(p.id) === value.modelId)
            .map((p) => ({
              value: String(p.id),
              label: `${p.name} (${p.family}): ${formatCount(p.parameters)} parameters, trained at ${p.trainedContext} tokens${p.retiredAt ? " (retired)" : ""}`,
            }))}
          error={issues["model.modelId"]}
          hint={profiles.length ? undefined : "No profiles yet; type a shape instead."}
        />
      ) : (
        <div className="grid gap-3 sm:grid-cols-4">
          {(Object.keys(SHAPE_LABELS) as ShapeField[]).map((f) => (
            <SheetInput
              key={f}
              label={SHAPE_LABELS[f].label}
              hint={SHAPE_LABELS[f].hint}
              value={value[f]}
              error={issues[`model.${f}`]}
              onChange={(t) => onChange({ ...value, [f]: t })}
            />
          ))}
        </div>
      )}
    </fieldset>
  );
}
