import { useFormContext } from "react-hook-form";
import type { MethodParams } from "@shared/schemas/analysis";
import { AS_SHIPPED_LABEL, shippedText } from "@shared/lineage";
import { Button } from "@/components/button";
import { SelectField } from "@/components/field";
import { formatCount } from "@/lib/format";
import type { RevisionForm } from "@/features/plans/lib/form-values";
import { useFieldError } from "./form-field";

/** What the plan form knows of a model that ships scaling (shared/lineage.ts). */
export type PlanLineage = { pretrainedContext: number; servedContext: number; shipped: MethodParams | null };

/** The shipped method without its factor: extending from the served length, an empty factor means target ÷ served. */
const withoutFactor = (m: MethodParams): MethodParams => {
  const { factor: _f, ...rest } = m as MethodParams & { factor?: number };
  return rest as MethodParams;
};

/**
 * Which length an already-scaled model's plan extends from, both lengths labelled; and a button that sets the
 * method to the model as shipped (kept at the served length, or extended from it when the target is longer).
 */
export function ExtendsFromField({ lineage }: { lineage: PlanLineage }) {
  const { register, setValue, getValues } = useFormContext<RevisionForm>();
  const error = useFieldError("revision.extendsFrom");
  const shipped = lineage.shipped;
  const asShipped = () => {
    if (!shipped) return;
    setValue("revision.extendsFrom", "served", { shouldDirty: true });
    setValue("revision.method", withoutFactor(shipped), { shouldDirty: true });
    if (!(Number(getValues("revision.targetContext")) >= lineage.servedContext))
      setValue("revision.targetContext", lineage.servedContext, { shouldDirty: true });
  };
  return (
    <div className="flex flex-col gap-2">
      <SelectField
        label="Extends from"
        error={error}
        hint="From the served length, a factor stretches the served length; the export carries it over the pre-trained length (×4 on a shipped ×4 exports ×16)."
        {...register("revision.extendsFrom", { setValueAs: (v) => (v === "served" ? "served" : undefined) })}
      >
        <option value="pretrained">Pre-trained length ({formatCount(lineage.pretrainedContext)} tokens)</option>
        <option value="served">
          Served length ({formatCount(lineage.servedContext)} tokens
          {shipped ? `, as shipped: ${shippedText(shipped)}` : ""})
        </option>
      </SelectField>
      {shipped && (
        <div>
          <Button variant="secondary" size="sm" onClick={asShipped}>
            Use the method {AS_SHIPPED_LABEL.toLowerCase()} ({shippedText(shipped)})
          </Button>
        </div>
      )}
    </div>
  );
}
