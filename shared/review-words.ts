/**
 * The words people read for the review workflow, in the product's rope-making vocabulary (docs/review-words.md).
 * Only what is displayed lives here: API values (`draft`, `in_review`, `approved`, `changes_requested`,
 * `superseded`, `approve`, `request_changes`), routes and audit action codes never change. The client labels,
 * the workflow mail and the audit trail's display read these, so a word is changed in one place.
 */
import type { RevisionState } from "./schemas/plans";

/** A revision's state in words. A draft is still being laid on the walk; inspection is the approvers' bench. */
export const STATE_WORDS: Record<RevisionState, string> = {
  draft: "On the walk",
  in_review: "At inspection",
  approved: "Passed",
  changes_requested: "Back to the walk",
  superseded: "Replaced",
};

/** One line per state, shown as the badge's title and in the glossary. */
export const STATE_MEANINGS: Record<RevisionState, string> = {
  draft: "being laid: only its author changes it",
  in_review: "laid and sent to inspection: approvers pass it or send it back",
  approved: "passed by enough inspectors: signed, immutable and exportable",
  changes_requested: "an inspector sent it back with a note; its author lays a new revision",
  superseded: "was passed, then a later passed revision of the same plan replaced it",
};

/** An approver's decision in words (API values `approve` and `request_changes`). */
export const DECISION_WORDS = {
  approve: { verb: "Pass", done: "Passed", submit: "Sign and pass" },
  request_changes: { verb: "Send back to the walk", done: "Sent back", submit: "Sign and send back" },
} as const;

/** The steps' button words. */
export const ACTION_WORDS = {
  submit: "Send to inspection",
  withdraw: "Take back to the walk",
  inspect: "Inspect",
  compare: "Lay revisions side by side",
} as const;

/** Passes counted towards a plan's quorum: "2 of 3 passes". */
export const passesText = (n: number, of: number) => `${n} of ${of} pass${of === 1 ? "" : "es"}`;

/** Display labels for the workflow's audit action codes; the codes themselves stay as recorded. */
export const AUDIT_ACTION_WORDS: Record<string, string> = {
  "revision.submitted": "Sent to inspection",
  "revision.withdrawn": "Taken back to the walk",
  "decision.approved": "One inspector passed it",
  "decision.changes_requested": "One inspector sent it back",
  "revision.approved": "Passed",
  "revision.changes_requested": "Back to the walk",
  "revision.superseded": "Replaced by a later pass",
};

/** Mail subject lead words, by mail kind. */
export const MAIL_SUBJECT_WORDS = {
  review_requested: "For inspection",
  withdrawn: "Taken back from inspection",
  changes_requested: "Back to the walk",
  approved: "Passed",
  ready: "Passed, ready to export",
} as const;
