import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { enqueueMail } from "../../mailer/outbox";
import {
  approvedMail,
  changesRequestedMail,
  planReadyMail,
  provenMail,
  unprovenMail,
  reviewRequestedMail,
  type PlanMailInput,
} from "../../mailer/messages";
import type { PlanRow, RevisionRow } from "./plans.repo";

export type NoticeKind = "review_requested" | "changes_requested" | "approved" | "ready" | "proven" | "unproven";

const BUILDERS = {
  review_requested: reviewRequestedMail,
  changes_requested: changesRequestedMail,
  approved: approvedMail,
  ready: planReadyMail,
  proven: provenMail,
  unproven: unprovenMail,
} satisfies Record<NoticeKind, (m: PlanMailInput) => unknown>;

/** Queues the workflow's mail in the same transaction as the state change, so it is sent only if the change commits. */
export async function notify(
  deps: AppDeps,
  ex: Executor,
  kind: NoticeKind,
  to: string[],
  ctx: { plan: PlanRow; revision: RevisionRow; actorName: string; comment?: string },
) {
  const mail = BUILDERS[kind]({
    planId: ctx.plan.id,
    planTitle: ctx.plan.title,
    revision: ctx.revision.number,
    actorName: ctx.actorName,
    comment: ctx.comment || undefined,
    contentHash: ctx.revision.contentHash,
    url: `${deps.config.publicUrl}/plans/${ctx.plan.id}?revision=${ctx.revision.number}`,
  });
  await enqueueMail(ex, { ...mail, to });
}
