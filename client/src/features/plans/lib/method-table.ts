import { findMethod, METHOD_IDS, methodEntry, type AnyMethodEntry } from "@shared/methods";
import { formatGrouped } from "@/lib/format";

export type { ParamField } from "@shared/methods";

/** The methods in the catalog's order, with the catalog's names and form fields (the workbench shows the same). */
export const METHOD_TABLE: readonly AnyMethodEntry[] = METHOD_IDS.map(methodEntry);

/** Look-up by a method id read from a form or a stored revision; unknown ids fall back to the id itself. */
export const methodLabel = (id: string) => findMethod(id)?.label ?? id;
export const methodShort = (id: string) => findMethod(id)?.short ?? id;
export { findMethod as methodEntry };

/** "Factor s 8, β fast (rotations) 32" from a method's parameters, or "engine defaults". */
export function describeParams(method: { method: string } & Record<string, unknown>): string {
  const entry = findMethod(method.method);
  const parts = Object.entries(method)
    .filter(([k, v]) => k !== "method" && v !== undefined)
    .map(([k, v]) => {
      const label = entry?.fields.find((p) => p.key === k)?.label ?? k;
      if (Array.isArray(v)) return `${label}: ${v.length} values`;
      const shown = typeof v === "boolean" ? (v ? "yes" : "no") : typeof v === "number" ? formatGrouped(v) : String(v);
      return `${label} ${shown}`;
    });
  return parts.length ? parts.join(", ") : "engine defaults";
}
