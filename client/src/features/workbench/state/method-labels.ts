import type { MethodParams } from "@shared/schemas/analysis";
import { AS_SHIPPED_LABEL, shippedText } from "@shared/lineage";
import { METHOD_LABELS } from "./method-fields";

/** Key order differs between a typed row and the profile's block; compare the values, not the spelling. */
const canonical = (m: MethodParams) =>
  JSON.stringify(
    Object.entries(m)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => a.localeCompare(b)),
  );

/**
 * The name each analysed method goes by in the legends and pickers: the model's own scaling is "As shipped (yarn ×4)",
 * as its row in the inputs says, so the charts name it the same way; every other row by its method.
 * Read from the analysed request (never the current rows), so stale figures keep their own names.
 */
export function methodLabels(methods: MethodParams[], shipped: MethodParams | null): string[] {
  const own = shipped ? canonical(shipped) : null;
  return methods.map((m) =>
    own !== null && canonical(m) === own ? `${AS_SHIPPED_LABEL} (${shippedText(shipped!)})` : METHOD_LABELS[m.method],
  );
}
