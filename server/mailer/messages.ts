import { MAIL_SUBJECT_WORDS as W } from "../../shared/review-words";

/**
 * Plain-text mail for the plans workflow. The plans service builds one of these and passes it,
 * with the recipients, to enqueueMail inside the transaction that changed the plan.
 */

export interface PlanMailInput {
  planId: number;
  planTitle: string;
  revision: number;
  /** Who caused the message: the submitter, or the approver who decided. */
  actorName: string;
  comment?: string;
  /** SHA-256 of the revision's canonical content, the value approvers sign. */
  contentHash: string;
  /** Link to the plan (or revision) page. */
  url: string;
  /** The revision's inspection round (1 at its first submission); numbered in round-specific subjects. */
  round?: number;
}

export interface PlanMail {
  kind: PlanMailKind;
  subject: string;
  body: string;
}

export type PlanMailKind =
  | "plan.review_requested"
  | "plan.withdrawn"
  | "plan.changes_requested"
  | "plan.approved"
  | "plan.ready"
  | "plan.proven"
  | "plan.unproven";

const SUBJECT_TITLE_MAX = 100;

/** One line, bounded, so a long or multi-line title cannot break the subject header. */
function subjectTitle(title: string): string {
  const line = title.replace(/\s+/g, " ").trim();
  return line.length > SUBJECT_TITLE_MAX ? `${line.slice(0, SUBJECT_TITLE_MAX - 1)}…` : line;
}

function commentBlock(actorName: string, comment?: string): string[] {
  const text = comment?.trim();
  if (!text) return [];
  return [`Comment from ${actorName}:`, ...text.split(/\r?\n/).map((l) => `  > ${l}`), ""];
}

function footer(m: PlanMailInput): string[] {
  return [
    `Open the plan: ${m.url}`,
    `Content hash (SHA-256): ${m.contentHash}`,
    "",
    "-- ",
    "Ropewalk, context-extension planning",
  ];
}

/** "rev. 2" or, for mail about one inspection round, "rev. 2, round 3": a resubmission never repeats a subject. */
const revisionPart = (m: PlanMailInput, withRound: boolean) =>
  withRound && m.round ? `rev. ${m.revision}, round ${m.round}` : `rev. ${m.revision}`;

function compose(kind: PlanMailKind, subject: string, m: PlanMailInput, lead: string[], withRound = false): PlanMail {
  return {
    kind,
    subject: `${subject}: "${subjectTitle(m.planTitle)}" ${revisionPart(m, withRound)}`,
    body: [...lead, "", ...commentBlock(m.actorName, m.comment), ...footer(m)].join("\n"),
  };
}

/** To the approvers, when a revision is sent to inspection; a later round says it is one. */
export function reviewRequestedMail(m: PlanMailInput): PlanMail {
  const again =
    m.round && m.round > 1
      ? [
          "",
          `This is round ${m.round} of this revision: it was taken back from inspection before. Decisions of earlier rounds stay on record but do not count towards this one.`,
        ]
      : [];
  return compose(
    "plan.review_requested",
    W.review_requested,
    m,
    [
      `${m.actorName} sent revision ${m.revision} of the plan "${m.planTitle}" to inspection and asks you to inspect it.`,
      ...again,
      "",
      "Passing it signs the content hash below. If the revision changes, its hash changes and it needs a new inspection.",
    ],
    true,
  );
}

/** To the approvers who were asked, when the author takes the revision back before it is decided. */
export function withdrawnMail(m: PlanMailInput): PlanMail {
  return compose(
    "plan.withdrawn",
    W.withdrawn,
    m,
    [
      `${m.actorName} took revision ${m.revision} of the plan "${m.planTitle}" back from inspection (round ${m.round ?? "?"}). It is on the walk again: nothing is waiting for your decision.`,
      "",
      "Decisions already recorded in this round stay on record. If it is sent again, you will be asked again.",
    ],
    true,
  );
}

/** To the author, when an approver asks for changes. */
export function changesRequestedMail(m: PlanMailInput): PlanMail {
  return compose("plan.changes_requested", W.changes_requested, m, [
    `${m.actorName} sent revision ${m.revision} of your plan "${m.planTitle}" back to the walk.`,
    "",
    "Lay a new revision with what was asked for and send it to inspection when it is ready.",
  ]);
}

/** To the author, when the revision has all the approvals it needs. */
export function approvedMail(m: PlanMailInput): PlanMail {
  return compose("plan.approved", W.approved, m, [
    `Revision ${m.revision} of your plan "${m.planTitle}" passed inspection; the last pass came from ${m.actorName}.`,
    "",
    "Each pass is a signature on the content hash below.",
  ]);
}

/** To everyone with the infra role, once a revision is approved and can be exported. */
export function planReadyMail(m: PlanMailInput): PlanMail {
  return compose("plan.ready", W.ready, m, [
    `Revision ${m.revision} of the plan "${m.planTitle}" passed inspection (last pass: ${m.actorName}) and is ready to export.`,
    "",
    "The export is the signed configuration patch: the rope_scaling block and max_position_embeddings",
    "of exactly the content whose hash is given below.",
    "",
    "The plan's figures are estimates. The longer context is confirmed only by long-context",
    "evaluations of the tuned model, not by this pass.",
  ]);
}

/** To the plan's people, when an approver finds every acceptance criterion met by the uploaded evidence. */
export function provenMail(m: PlanMailInput): PlanMail {
  return compose("plan.proven", "Proven", m, [
    `${m.actorName} marked revision ${m.revision} of the plan "${m.planTitle}" proven: the evaluation evidence meets every acceptance criterion.`,
    "",
    "The decision is signed over the content hash below and the evidence it looked at.",
  ]);
}

/** To the plan's people, when an approver finds the evidence short of the criteria. */
export function unprovenMail(m: PlanMailInput): PlanMail {
  return compose("plan.unproven", "Not proven", m, [
    `${m.actorName} marked revision ${m.revision} of the plan "${m.planTitle}" not proven.`,
  ]);
}
