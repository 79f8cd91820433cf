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
}

export interface PlanMail {
  kind: PlanMailKind;
  subject: string;
  body: string;
}

export type PlanMailKind =
  "plan.review_requested" | "plan.changes_requested" | "plan.approved" | "plan.ready" | "plan.proven" | "plan.unproven";

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

function compose(kind: PlanMailKind, subject: string, m: PlanMailInput, lead: string[]): PlanMail {
  return {
    kind,
    subject: `${subject}: "${subjectTitle(m.planTitle)}" rev. ${m.revision}`,
    body: [...lead, "", ...commentBlock(m.actorName, m.comment), ...footer(m)].join("\n"),
  };
}

/** To the approvers, when a revision is submitted. */
export function reviewRequestedMail(m: PlanMailInput): PlanMail {
  return compose("plan.review_requested", "Review requested", m, [
    `${m.actorName} submitted revision ${m.revision} of the plan "${m.planTitle}" and asked for your review.`,
    "",
    "Approving signs the content hash below. If the revision changes, its hash changes and it needs a new review.",
  ]);
}

/** To the author, when an approver asks for changes. */
export function changesRequestedMail(m: PlanMailInput): PlanMail {
  return compose("plan.changes_requested", "Changes requested", m, [
    `${m.actorName} asked for changes to revision ${m.revision} of your plan "${m.planTitle}".`,
    "",
    "Edit the plan and submit a new revision when it is ready.",
  ]);
}

/** To the author, when the revision has all the approvals it needs. */
export function approvedMail(m: PlanMailInput): PlanMail {
  return compose("plan.approved", "Approved", m, [
    `Revision ${m.revision} of your plan "${m.planTitle}" is approved; the last approval came from ${m.actorName}.`,
    "",
    "The approvals are signatures on the content hash below.",
  ]);
}

/** To everyone with the infra role, once a revision is approved and can be exported. */
export function planReadyMail(m: PlanMailInput): PlanMail {
  return compose("plan.ready", "Approved plan ready", m, [
    `Revision ${m.revision} of the plan "${m.planTitle}" is approved (last approval: ${m.actorName}) and ready to export.`,
    "",
    "The export is the signed configuration patch: the rope_scaling block and max_position_embeddings",
    "of exactly the content whose hash is given below.",
    "",
    "The plan's figures are estimates. The longer context is confirmed only by long-context",
    "evaluations of the tuned model, not by this approval.",
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
