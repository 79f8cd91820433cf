import { get, useFormContext, useWatch, type FieldValues } from "react-hook-form";
import { Field, SelectField, TextInput } from "@/components/field";
import { defaultText } from "@shared/methods";
import { METHOD_TABLE, methodEntry, type ParamField } from "@/features/plans/lib/method-table";
import { toNumberList, toOptionalBoolean } from "@/features/plans/lib/form-values";
import { NumberField, useFieldError } from "./form-field";

function ParamInput({ name, param }: { name: string; param: ParamField }) {
  const { register } = useFormContext<FieldValues>();
  const path = `${name}.${param.key}`;
  const error = useFieldError(path);
  const label = param.required ? param.label : `${param.label} (optional)`;
  // The plan form has no model context here, so model-dependent defaults are given in words.
  const unknown = { scale: null, targetContext: null, pairs: null };
  const fallback = defaultText(param, unknown);
  // A field whose default needs explaining says it in full (which repeats the default), else the default alone.
  const hint = [param.hint, param.note ? param.note(unknown) : fallback && `Left empty: ${fallback}.`]
    .filter(Boolean)
    .join(" ");
  if (param.kind === "number" || param.kind === "integer") {
    return <NumberField name={path} label={label} hint={hint} step={param.kind === "integer" ? "1" : "any"} />;
  }
  if (param.kind === "boolean") {
    return (
      <SelectField label={label} hint={hint} error={error} {...register(path, { setValueAs: toOptionalBoolean })}>
        <option value="">Engine default</option>
        <option value="true">Yes</option>
        <option value="false">No</option>
      </SelectField>
    );
  }
  return (
    <Field label={label} hint={hint} error={error}>
      {({ id, describedBy, invalid }) => (
        <TextInput
          id={id}
          aria-describedby={describedBy}
          aria-invalid={invalid}
          {...register(path, { setValueAs: toNumberList })}
        />
      )}
    </Field>
  );
}

/**
 * A method and its own parameters at `name` (an object `{ method, ...params }`). Changing the method
 * replaces the whole object, so parameters of the previous method never reach the strict schema.
 * `collapsed` folds the parameters away (stages repeat the plan's method more often than not).
 */
export function MethodFields({
  name,
  label = "Method",
  collapsed = false,
}: {
  name: string;
  label?: string;
  collapsed?: boolean;
}) {
  const { setValue, control, getValues, formState } = useFormContext<FieldValues>();
  const method = useWatch({ control, name: `${name}.method` }) as string;
  // Folded parameters open by themselves when the method already sets one, or when one of them is marked wrong.
  const hasParams = Object.entries((getValues(name) as object | undefined) ?? {}).some(
    ([k, v]) => k !== "method" && v !== undefined,
  );
  const marked = get(formState.errors, name) !== undefined;
  const rootError = useFieldError(name);
  const entry = methodEntry(method);
  const params = entry && (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3" key={entry.id}>
      {entry.fields.map((p) => (
        <ParamInput key={p.key} name={name} param={p} />
      ))}
    </div>
  );
  return (
    <div className="flex flex-col gap-3">
      <SelectField
        label={label}
        hint={entry?.summary}
        error={rootError}
        value={method}
        onChange={(e) => setValue(name, { method: e.target.value }, { shouldDirty: true, shouldValidate: false })}
      >
        {METHOD_TABLE.map((m) => (
          <option key={m.id} value={m.id}>
            {m.label}
          </option>
        ))}
      </SelectField>
      {entry &&
        entry.fields.length > 0 &&
        (collapsed ? (
          <details className="rounded-md border border-rule px-3 py-2" open={hasParams || marked || undefined}>
            <summary className="cursor-pointer text-note font-medium">
              {entry.short} parameters{hasParams ? "" : " (engine defaults)"}
            </summary>
            <div className="pt-3">{params}</div>
          </details>
        ) : (
          params
        ))}
    </div>
  );
}
