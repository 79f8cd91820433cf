import { MAX_METHODS } from "@shared/schemas/analysis";
import { Button } from "@/components/button";
import type { MethodRow as Row } from "../state/inputs";
import type { FieldContext } from "../state/method-fields";
import type { FieldErrors } from "../state/to-request";
import { MethodRow } from "./method-row";

type MethodRowsProps = { rows: Row[]; context: FieldContext; errors: FieldErrors; onChange: (rows: Row[]) => void };

/** The methods being compared, in order; the row number is the colour and the number in every legend. */
export function MethodRows({ rows, context, errors, onChange }: MethodRowsProps) {
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
          onChange={(next) => onChange(rows.map((r, k) => (k === i ? next : r)))}
          onRemove={() => onChange(rows.filter((_r, k) => k !== i))}
        />
      ))}
      {rows.length < MAX_METHODS && (
        <div>
          <Button variant="secondary" size="sm" onClick={() => onChange([...rows, { method: "ntk", params: {} }])}>
            Add a method
          </Button>
        </div>
      )}
    </div>
  );
}
