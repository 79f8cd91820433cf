import { isApiError } from "@/lib/api-client";
import { STATE_LABELS } from "../components/state-badge";
import type { RevisionState } from "@shared/schemas/plans";

/**
 * Plain words for a refused workflow step. A 409 names the revision's current state in `fields.state`
 * (someone else acted first); a 403 means the role or authorship does not allow it.
 */
export function actionErrorText(error: unknown): string {
  if (!isApiError(error)) return "Something went wrong. Try again.";
  const state = error.fields?.state;
  if (error.status === 409 && state) {
    const label = STATE_LABELS[state as RevisionState] ?? state;
    return `Not done: the revision is now “${label}”, so this step no longer applies. The page shows its current state.`;
  }
  if (error.status === 403) return `Not allowed: ${error.message}.`;
  return error.message;
}
