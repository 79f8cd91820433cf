import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { pathOfKey, plainSentence } from "@shared/validation-messages";
import { isApiError } from "./api-client";

/**
 * Puts an API error's per-field messages beside the matching inputs ("roles.0" lands on "roles")
 * and returns the message to show above the form for whatever could not be placed, or null.
 */
export function applyApiErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: readonly Path<T>[],
): string | null {
  if (!isApiError(error)) return "Something went wrong. Try again.";
  let placed = false;
  const leftover: string[] = [];
  for (const [key, raw] of Object.entries(error.fields ?? {})) {
    // The server already speaks in sentences for what it parsed; a service's short reason ("retired") gets one too.
    const message = plainSentence(pathOfKey(key), raw);
    const name = fieldNames.find((f) => f === key || key.startsWith(`${f}.`));
    if (name) {
      setError(name, { type: "server", message });
      placed = true;
    } else {
      leftover.push(message);
    }
  }
  if (leftover.length) return leftover.join(" ");
  return placed ? null : error.message;
}
