import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { isApiError } from "../../../lib/api-client";
import { formPathOf } from "./form-values";

/** Form paths that have an input on screen; a server field under one of them is shown beside it. */
const PLACED = ["title", "purpose", "modelId", "requiredApprovals", "revision.targetContext", "revision.method", "revision.bands", "revision.stages", "revision.acceptance", "revision.notes"];

/**
 * Puts a refused save's field messages beside their inputs and returns what to say above the form:
 * the server's message when something could not be placed (or nothing was named), else null.
 */
export function placeServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): string | null {
  if (!isApiError(error)) return "Something went wrong. Try again.";
  const leftover: string[] = [];
  let placed = 0;
  for (const [key, message] of Object.entries(error.fields ?? {})) {
    const path = formPathOf(key);
    if (PLACED.some((p) => path === p || path.startsWith(`${p}.`))) {
      setError(path as Path<T>, { type: "server", message });
      placed += 1;
    } else leftover.push(`${key}: ${message}`);
  }
  if (leftover.length) return `${error.message} (${leftover.join("; ")})`;
  return placed ? null : error.message;
}
