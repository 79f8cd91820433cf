import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import type { PlanRow, RevisionRow } from "./plans.repo";

export type NoticeKind = "review_requested" | "changes_requested" | "approved" | "ready";

/** Queues the workflow's mail in the same transaction as the state change (placeholder until the mail module lands). */
export async function notify(
  _deps: AppDeps, _ex: Executor, _kind: NoticeKind, _to: string[],
  _ctx: { plan: PlanRow; revision: RevisionRow; actorName: string; comment?: string },
) {}
