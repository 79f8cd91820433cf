import type { OutboxRow } from "@shared/schemas/mail";
import { formatDateTime } from "@/lib/format";

/** What each workflow mail is for, in the review words (docs/review-words.md); other kinds show their code. */
export const KIND_WORDS: Record<string, string> = {
  "plan.review_requested": "Asked the inspectors",
  "plan.withdrawn": "Told the inspectors it was taken back",
  "plan.changes_requested": "Told the author it is back on the walk",
  "plan.approved": "Told the author it passed",
  "plan.ready": "Told infra it is ready to export",
  "plan.proven": "Told the plan's people it is proven",
  "plan.unproven": "Told the plan's people it is not proven",
};

const tries = (n: number) => `${n} ${n === 1 ? "try" : "tries"}`;

/** One delivery's attempts in a line: sent (after how many tries), waiting, failing with its error, or given up. */
export function attemptsLine(r: OutboxRow): string {
  if (r.status === "sent") return `Sent ${r.sentAt ? formatDateTime(r.sentAt) : ""} after ${tries(r.attempts)}`.trim();
  if (r.status === "failed") return `Given up after ${tries(r.attempts)}`;
  if (r.attempts === 0) return `Waiting for its first try (due ${formatDateTime(r.nextAttemptAt)})`;
  return `${tries(r.attempts)} failed so far; next try ${formatDateTime(r.nextAttemptAt)}`;
}

export type PlanThread = { key: string; title: string; planId: number | null; rows: OutboxRow[] };

/** Deliveries grouped by plan, the plan with the newest mail first; each plan's mail oldest first, as it happened. */
export function threadsOf(rows: OutboxRow[]): PlanThread[] {
  const threads = new Map<string, PlanThread>();
  for (const r of rows) {
    const key = r.plan ? `plan-${r.plan.id}` : "other";
    const t = threads.get(key) ?? {
      key,
      title: r.plan ? r.plan.title : "Other mail",
      planId: r.plan?.id ?? null,
      rows: [],
    };
    t.rows.push(r);
    threads.set(key, t);
  }
  const newest = (t: PlanThread) => Math.max(...t.rows.map((r) => r.id));
  return [...threads.values()]
    .map((t) => ({ ...t, rows: [...t.rows].sort((a, b) => a.id - b.id) }))
    .sort((a, b) => newest(b) - newest(a));
}
