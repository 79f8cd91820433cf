import type { SinkMessage } from "@shared/schemas/mail";
import { formatDateTime } from "@/lib/format";

/** What the local sink received, newest first; each message opens in place. */
export function MailMessages({ messages }: { messages: SinkMessage[] }) {
  if (messages.length === 0) return <p className="text-body text-ink-soft">No messages received.</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label="Received messages">
      {messages.map((m) => (
        <li key={m.id}>
          <details className="rounded-md border border-rule bg-white/40 px-3 py-2" aria-label={m.subject}>
            <summary className="cursor-pointer">
              <span className="text-body font-medium break-words" data-testid="subject">
                {m.subject || "(no subject)"}
              </span>
              <span className="block text-note break-all text-ink-soft">
                to {m.to.join(", ")} · {formatDateTime(m.receivedAt)} · from {m.from}
              </span>
            </summary>
            <pre className="mt-2 font-sans text-body break-words whitespace-pre-wrap">{m.text}</pre>
          </details>
        </li>
      ))}
    </ul>
  );
}
