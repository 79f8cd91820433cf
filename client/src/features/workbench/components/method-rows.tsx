import { MAX_METHODS } from "@shared/schemas/analysis";
import { Button } from "@/components/button";
import type { MethodRow as Row } from "../state/inputs";
import type { FieldContext } from "../state/method-fields";
import type { FieldErrors } from "../state/to-request";
import { MethodRow } from "./method-row";
import type { MethodParams } from "@shared/schemas/analysis";
import { shippedText } from "@shared/lineage";
import { shippedRow } from "../state/shipped-row";

type MethodRowsProps = {
  rows: Row[];
  context: FieldContext;
  errors: FieldErrors;
  onChange: (rows: Row[]) => void;
  /** The saved profile's shipped scaling ("as shipped"), offered as a method to compare against; null when none. */
  shipped?: MethodParams | null;
};

/** The methods being compared, in order; the row number is the colour and the number in every legend. */
export function MethodRows({ rows, context, errors, onChange, shipped = null }: MethodRowsProps) {
  return (
    <div className="flex flex-col gap-3">
      {errors.methods && (
        <p className="text-note text-signal" role="alert">
          {errors.methods}
        </p>
      )}
      {rows.map((row, i) => (
        <MethodRow
          // Rows have no identity beyond their place; removing one re-keys the rest, which is what the URL does too.
          key={`${i}-${row.method}`}
          index={i}
          row={row}
          context={context}
          errors={errors}
          canRemove={rows.length > 1}
          shipped={shipped}
          onChange={(next) => onChange(rows.map((r, k) => (k === i ? next : r)))}
          onRemove={() => onChange(rows.filter((_r, k) => k !== i))}
        />
      ))}
      {rows.length < MAX_METHODS && (
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" size="sm" onClick={() => onChange([...rows, { method: "ntk", params: {} }])}>
            Add a method
          </Button>
          {shipped && !rows.some((r) => r.shipped) && (
            <Button variant="secondary" size="sm" onClick={() => onChange([shippedRow(shipped), ...rows])}>
              Compare with the model as shipped ({shippedText(shipped)})
            </Button>
          )}
        </div>
      )}
    </div>
  );
}
