import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { and, desc, eq } from "drizzle-orm";
import { enqueueMail } from "../../mailer/outbox";
import { mailOutbox } from "../../db/schema";
import {
  approvedMail,
  changesRequestedMail,
  withdrawnMail,
  planReadyMail,
  provenMail,
  unprovenMail,
  reviewRequestedMail,
  type PlanMailInput,
} from "../../mailer/messages";
import type { PlanRow, RevisionRow } from "./plans.repo";

export type NoticeKind =
  "review_requested" | "withdrawn" | "changes_requested" | "approved" | "ready" | "proven" | "unproven";

const BUILDERS = {
  review_requested: reviewRequestedMail,
  withdrawn: withdrawnMail,
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
    round: ctx.revision.round,
  });
  await enqueueMail(ex, { ...mail, to, planId: ctx.plan.id, revision: ctx.revision.number });
}

/** Who was asked to inspect this revision's latest round: the recipients of its last review-requested mail. */
export async function askedReviewers(ex: Executor, planId: number, revision: number): Promise<string[] | null> {
  const [row] = await ex
    .select({ to: mailOutbox.toAddresses })
    .from(mailOutbox)
    .where(
      and(
        eq(mailOutbox.planId, planId),
        eq(mailOutbox.revision, revision),
        eq(mailOutbox.kind, "plan.review_requested"),
      ),
    )
    .orderBy(desc(mailOutbox.id))
    .limit(1);
  return row ? row.to : null;
}
