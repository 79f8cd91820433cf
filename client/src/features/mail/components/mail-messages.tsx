import { useState } from "react";
import type { SinkMessage } from "@shared/schemas/mail";
import { formatDateTime } from "@/lib/format";

/** Received messages on the left, the chosen one in full on the right. */
export function MailMessages({ messages }: { messages: SinkMessage[] }) {
  const [chosenId, setChosenId] = useState<number | null>(null);
  const chosen = messages.find((m) => m.id === chosenId) ?? messages[0];
  if (messages.length === 0) return <p className="text-body text-ink-soft">No messages received.</p>;
  return (
    <div className="grid gap-4 md:grid-cols-[minmax(0,22rem)_1fr]">
      <ul className="flex max-h-[32rem] flex-col gap-1 overflow-y-auto" aria-label="Received messages">
        {messages.map((m) => (
          <li key={m.id}>
            <button
              type="button"
              aria-current={m.id === chosen?.id ? "true" : undefined}
              onClick={() => setChosenId(m.id)}
              className={`w-full rounded-md border px-3 py-2 text-left ${m.id === chosen?.id ? "border-hemp bg-hemp-pale/60" : "border-rule bg-white/40 hover:border-hemp"}`}
            >
              <span className="block truncate text-body font-medium">{m.subject || "(no subject)"}</span>
              <span className="block truncate text-note text-ink-soft">
                to {m.to.join(", ")} · {formatDateTime(m.receivedAt)}
              </span>
            </button>
          </li>
        ))}
      </ul>
      {chosen && (
        <article aria-label="Message" className="rounded-md border border-rule bg-white/60 p-4">
          <h3 className="text-lead font-semibold">{chosen.subject || "(no subject)"}</h3>
          <dl className="mt-2 grid grid-cols-[5rem_1fr] gap-y-1 text-note">
            <dt className="text-ink-soft">From</dt>
            <dd>{chosen.from}</dd>
            <dt className="text-ink-soft">To</dt>
            <dd>{chosen.to.join(", ")}</dd>
            <dt className="text-ink-soft">Received</dt>
            <dd>{formatDateTime(chosen.receivedAt)}</dd>
          </dl>
          <pre className="mt-3 font-sans text-body whitespace-pre-wrap">{chosen.text}</pre>
        </article>
      )}
    </div>
  );
}
