import { Link } from "react-router-dom";
import type { OutboxRow } from "@shared/schemas/mail";
import { Chip } from "@/components/notice";
import { paths } from "@/config/paths";
import { formatDateTime } from "@/lib/format";
import { KIND_WORDS, attemptsLine, threadsOf } from "../lib/delivery-words";

const TONE = { sent: "seaglass", pending: "hemp" } as const;

/** One message on a plan's line: why it was sent, to whom, its delivery attempts, and its body opened in place. */
function Delivery({ r }: { r: OutboxRow }) {
  return (
    <li className="relative" data-outbox-id={r.id} data-status={r.status}>
      <span aria-hidden className="absolute top-2 -left-[1.45rem] size-3 rounded-full border-2 border-hemp bg-paper" />
      <p className="flex flex-wrap items-center gap-2 text-body">
        <span className="font-medium" data-testid="kind">
          {KIND_WORDS[r.kind] ?? <code className="text-note">{r.kind}</code>}
        </span>
        {r.plan?.revision != null && <span className="text-note text-ink-soft">revision {r.plan.revision}</span>}
        <Chip tone={TONE[r.status as keyof typeof TONE] ?? "muted"}>{r.status}</Chip>
      </p>
      <p className="text-note break-all text-ink-soft">
        queued {formatDateTime(r.createdAt)} · to {r.to.join(", ")}
      </p>
      <p className="text-note" data-testid="attempts">
        {attemptsLine(r)}
        {r.lastError && <span className="block break-all text-signal-dark">Last error: {r.lastError}</span>}
      </p>
      <details className="mt-1 rounded-md border border-rule bg-white/50 px-3 py-1">
        <summary className="cursor-pointer text-note font-medium break-all">{r.subject}</summary>
        <pre className="mt-2 font-sans text-body break-words whitespace-pre-wrap">{r.body}</pre>
      </details>
    </li>
  );
}

/** The outbox as a line per plan: each plan's workflow mail in the order it happened, attempts inline. */
export function DeliveryTimeline({ rows }: { rows: OutboxRow[] }) {
  if (rows.length === 0) return <p className="text-body text-ink-soft">Nothing was queued.</p>;
  return (
    <div className="flex flex-col gap-6" aria-label="Deliveries by plan" role="list">
      {threadsOf(rows).map((t) => (
        <section key={t.key} role="listitem" aria-label={t.title} className="flex min-w-0 flex-col gap-2">
          <h3 className="text-lead font-semibold break-words">
            {t.planId !== null ? (
              <Link to={paths.plan(t.planId)} className="text-ink underline decoration-rule-strong underline-offset-4">
                {t.title}
              </Link>
            ) : (
              t.title
            )}
          </h3>
          <ol className="flex flex-col gap-3 border-l-2 border-hemp-light/60 pl-4">
            {t.rows.map((r) => (
              <Delivery key={r.id} r={r} />
            ))}
          </ol>
        </section>
      ))}
    </div>
  );
}
