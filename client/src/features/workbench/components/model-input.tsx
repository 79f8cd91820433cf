import type { ReactNode } from "react";
import type { ModelProfile } from "@shared/schemas/models";
import { TextField, SelectField } from "@/components/field";
import { tokens } from "../figures";
import { EMPTY_SHAPE, type ModelChoice } from "../state/inputs";
import type { FieldErrors } from "../state/to-request";

type ModelInputProps = {
  choice: ModelChoice;
  profiles: ModelProfile[];
  onChange: (choice: ModelChoice) => void;
  errors: FieldErrors;
  /** The search box that narrows `profiles` (the server pages them), shown above the picker. */
  search?: ReactNode;
};

const SHAPE_FIELDS = [
  { key: "headDim", label: "Head dimension", placeholder: "128" },
  { key: "partialRotaryFactor", label: "Rotary fraction", placeholder: "1" },
  { key: "ropeTheta", label: "Base b", placeholder: "10000" },
  { key: "trainedContext", label: "Trained context L", placeholder: "4096" },
] as const;

const describe = (p: ModelProfile) =>
  `${p.name} — d ${p.rotaryDim}, b ${tokens(p.ropeTheta)}, L ${tokens(p.trainedContext)}`;

/** A saved profile, or a rotary shape typed in for a quick look. */
export function ModelInput({ choice, profiles, onChange, errors, search }: ModelInputProps): ReactNode {
  const value = choice.kind === "shape" ? "shape" : choice.id === null ? "" : String(choice.id);
  return (
    <div className="flex flex-col gap-3">
      {search}
      <SelectField
        label="Model"
        value={value}
        error={errors.model ?? errors["model.modelId"]}
        onChange={(e) =>
          onChange(
            e.target.value === "shape"
              ? EMPTY_SHAPE
              : { kind: "saved", id: e.target.value ? Number(e.target.value) : null },
          )
        }
      >
        <option value="">Pick a saved profile…</option>
        {/* Retired profiles leave the picker, except the one a link already names. */}
        {profiles
          .filter((p) => !p.retiredAt || String(p.id) === value)
          .map((p) => (
            <option key={p.id} value={p.id}>
              {describe(p)}
              {p.retiredAt ? " (retired)" : ""}
            </option>
          ))}
        <option value="shape">Type a shape in…</option>
      </SelectField>
      {choice.kind === "shape" && (
        <div className="grid grid-cols-2 gap-3">
          {SHAPE_FIELDS.map((f) => (
            <TextField
              key={f.key}
              label={f.label}
              inputMode="decimal"
              placeholder={f.placeholder}
              value={choice[f.key]}
              error={errors[`model.${f.key}`]}
              onChange={(e) => onChange({ ...choice, [f.key]: e.target.value })}
            />
          ))}
        </div>
      )}
    </div>
  );
}
