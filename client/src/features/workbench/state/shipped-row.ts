import type { MethodParams } from "@shared/schemas/analysis";
import type { MethodRow } from "./inputs";

/**
 * The profile's shipped scaling as a workbench row: its parameters as the boxes show them, factor included, so the
 * engine runs it over the trained (pre-trained) length exactly as the config's loader does.
 */
export function shippedRow(shipped: MethodParams): MethodRow {
  const params: Record<string, string> = {};
  for (const [k, v] of Object.entries(shipped)) {
    if (k === "method" || v === undefined) continue;
    params[k] = Array.isArray(v) ? v.join(", ") : String(v);
  }
  return { method: shipped.method, params, shipped: true };
}
