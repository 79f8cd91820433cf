import { useState } from "react";
import { METHOD_IDS, type MethodId } from "@shared/schemas/analysis";
import { Button } from "@/components/button";
import { TextAreaField, TextField, SelectField } from "@/components/field";
import { methodColour } from "../charts/palette";
import { sig } from "../figures";
import { defaultText, METHOD_LABELS, methodEntry, type FieldContext, type MethodField } from "../state/method-fields";
import type { MethodRow as Row } from "../state/inputs";
import type { FieldErrors } from "../state/to-request";
import type { MethodParams } from "@shared/schemas/analysis";
import { AS_SHIPPED_LABEL, shippedText } from "@shared/lineage";
import { shippedRow } from "../state/shipped-row";

/** The select's value for the "as shipped" row (never a method id). */
const SHIPPED = "shipped";

type MethodRowProps = {
  index: number;
  row: Row;
  context: FieldContext;
  errors: FieldErrors;
  canRemove: boolean;
  onChange: (row: Row) => void;
  onRemove: () => void;
  shipped?: MethodParams | null;
};

/** The list fields of LongRoPE: d/2 numbers; two buttons fill them with neutral starting values. */
function ListField({
  field,
  value,
  error,
  context,
  onChange,
}: {
  field: MethodField;
  value: string;
  error?: string;
  context: FieldContext;
  onChange: (v: string) => void;
}) {
  const fill = (x: number) => onChange(Array.from({ length: context.pairs ?? 0 }, () => sig(x, 6)).join(", "));
  return (
    <div className="flex flex-col gap-1 sm:col-span-2">
      <TextAreaField
        label={field.label}
        error={error}
        hint={context.pairs === null ? field.hint : `${context.pairs} numbers. ${field.hint ?? ""}`}
        rows={2}
        value={value}
        placeholder="comma-separated"
        onChange={(e) => onChange(e.target.value)}
        className="font-mono text-note"
      />
      {context.pairs !== null && (
        <div className="flex gap-2">
          {field.key === "longFactor" && context.scale !== null && (
            <Button variant="quiet" size="sm" onClick={() => fill(context.scale!)}>
              Fill with s = {sig(context.scale, 4)}
            </Button>
          )}
          <Button variant="quiet" size="sm" onClick={() => fill(1)}>
            Fill with 1
          </Button>
        </div>
      )}
    </div>
  );
}

/** "2 set" / "defaults": what a folded row hides. */
const paramCount = (row: Row) => {
  const set = Object.values(row.params).filter((v) => v.trim() !== "").length;
  return set ? `${set} set` : "defaults";
};

/** One method to compare: pick the method, then only its own parameters; empty boxes use the default shown. */
export function MethodRow({ index, row, context, errors, canRemove, onChange, onRemove, shipped }: MethodRowProps) {
  const err = (key: string) => errors[`methods.${index}.${key}`];
  // An edited parameter makes the row an ordinary method: it no longer is the model as shipped.
  const set = (key: string, value: string) => onChange({ method: row.method, params: { ...row.params, [key]: value } });
  const pick = (value: string) =>
    onChange(value === SHIPPED && shipped ? shippedRow(shipped) : { method: value as MethodId, params: {} });
  const fields = methodEntry(row.method).fields;
  const [folded, setFolded] = useState(false);
  // A row with a field marked wrong never hides it.
  const marked = fields.some((f) => err(f.key) !== undefined);
  const open = !folded || marked;
  return (
    <fieldset
      className="flex flex-col gap-3 rounded-md border border-rule bg-white/40 p-3"
      style={{ borderLeft: `4px solid ${methodColour(index)}` }}
      data-testid={`method-row-${index}`}
    >
      <legend className="sr-only">Method {index + 1}</legend>
      <div className="flex items-end gap-2">
        <div className="min-w-0 flex-1">
          <SelectField
            label={`Method ${index + 1}`}
            value={row.shipped ? SHIPPED : row.method}
            error={errors[`methods.${index}`] ?? errors[`methods.${index}.method`]}
            onChange={(e) => pick(e.target.value)}
          >
            {(shipped || row.shipped) && (
              <option value={SHIPPED}>
                {AS_SHIPPED_LABEL}
                {shipped ? ` (${shippedText(shipped)})` : ""}
              </option>
            )}
            {METHOD_IDS.map((m) => (
              <option key={m} value={m}>
                {METHOD_LABELS[m]}
              </option>
            ))}
          </SelectField>
        </div>
        {fields.length > 0 && (
          <Button
            variant="quiet"
            size="sm"
            onClick={() => setFolded(open)}
            aria-expanded={open}
            aria-controls={`method-row-${index}-fields`}
            aria-label={`${open ? "Fold" : "Unfold"} the parameters of method ${index + 1}`}
            className="mb-1"
          >
            {open ? "Fold" : `Unfold (${paramCount(row)})`}
          </Button>
        )}
        {canRemove && (
          <Button
            variant="quiet"
            size="sm"
            onClick={onRemove}
            aria-label={`Remove method ${index + 1}`}
            className="mb-1"
          >
            Remove
          </Button>
        )}
      </div>
      {fields.length > 0 && open && (
        <div className="grid gap-3 sm:grid-cols-2" id={`method-row-${index}-fields`}>
          {fields.map((f) => {
            const value = row.params[f.key] ?? "";
            if (f.kind === "list")
              return (
                <ListField
                  key={f.key}
                  field={f}
                  value={value}
                  error={err(f.key)}
                  context={context}
                  onChange={(v) => set(f.key, v)}
                />
              );
            if (f.kind === "boolean") {
              return (
                <SelectField
                  key={f.key}
                  label={f.label}
                  value={value}
                  error={err(f.key)}
                  onChange={(e) => set(f.key, e.target.value)}
                >
                  <option value="">default ({defaultText(f, context)})</option>
                  <option value="true">yes</option>
                  <option value="false">no</option>
                </SelectField>
              );
            }
            return (
              <TextField
                key={f.key}
                label={f.label}
                inputMode="decimal"
                value={value}
                placeholder={f.required ? "required" : defaultText(f, context)}
                hint={f.note ? `${f.hint ?? ""} ${f.note(context)}`.trim() : f.hint}
                error={err(f.key)}
                onChange={(e) => set(f.key, e.target.value)}
              />
            );
          })}
        </div>
      )}
    </fieldset>
  );
}
