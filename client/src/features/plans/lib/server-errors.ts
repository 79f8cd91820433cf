import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { isApiError } from "@/lib/api-client";
import { fieldLabel, pathOfKey, plainSentence } from "@shared/validation-messages";
import { formPathOf } from "./form-values";

/** Form paths that have an input on screen; a server field under one of them is shown beside it. */
const PLACED = [
  "title",
  "purpose",
  "modelId",
  "requiredApprovals",
  "revision.targetContext",
  "revision.method",
  "revision.bands",
  "revision.stages",
  "revision.acceptance",
  "revision.notes",
];

/**
 * Puts a refused save's field messages beside their inputs and returns what to say above the form:
 * the server's message when something could not be placed (or nothing was named), else null.
 */
export function placeServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): string | null {
  if (!isApiError(error)) return "Something went wrong. Try again.";
  const leftover: string[] = [];
  let placed = 0;
  for (const [key, raw] of Object.entries(error.fields ?? {})) {
    const message = plainSentence(pathOfKey(key), raw);
    const path = formPathOf(key);
    if (PLACED.some((p) => path === p || path.startsWith(`${p}.`))) {
      setError(path as Path<T>, { type: "server", message });
      placed += 1;
    } else leftover.push(message);
  }
  if (leftover.length) return leftover.join(" ");
  return placed ? null : error.message;
}

/** Dotted paths of every message in a react-hook-form error tree ("revision.stages.1.steps"). */
export function errorPaths(errors: object, prefix = ""): string[] {
  const out: string[] = [];
  for (const [key, value] of Object.entries(errors)) {
    if (!value || typeof value !== "object" || key === "ref") continue;
    const path = prefix ? `${prefix}.${key}` : key;
    if (typeof (value as { message?: unknown }).message === "string") out.push(path);
    out.push(...errorPaths(value as object, path).filter((p) => p !== path));
  }
  return [...new Set(out)];
}

/** The line above a form that did not pass its own checks, so a mark further down the page is not missed. */
export const invalidSummary = (errors: object) => {
  const labels = [...new Set(errorPaths(errors).map((p) => fieldLabel(pathOfKey(p.replace(/^revision\./, "")))))];
  const named = labels.length > 1 ? `${labels.slice(0, -1).join(", ")} and ${labels[labels.length - 1]}` : labels[0];
  return `Nothing was saved: check ${named}; each is marked beside its field.`;
};
