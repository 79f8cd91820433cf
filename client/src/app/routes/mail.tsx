import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { Button } from "@/components/button";
import { TextField } from "@/components/field";
import { Page, Panel } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { useDebouncedText } from "@/lib/search-state";
import { useDeliverMail } from "@/features/mail/api/deliver-mail";
import { mailQueries } from "@/features/mail/api/queries";
import { MailMessages } from "@/features/mail/components/mail-messages";
import { DeliveryTimeline } from "@/features/mail/components/delivery-timeline";

export function MailRoute() {
  const [q, setQ] = useState("");
  const [text, setText] = useDebouncedText(q, (v) => setQ(v ?? ""));
  const mail = useQuery(mailQueries.view(q));
  const deliver = useDeliverMail();
  const [result, setResult] = useState<{ tone: "success" | "alert"; text: string } | null>(null);

  const deliverNow = () => {
    setResult(null);
    deliver.mutate(undefined, {
      onSuccess: (r) =>
        setResult({
          tone: r.failed ? "alert" : "success",
          text:
            r.sent + r.failed === 0
              ? "Nothing was due."
              : `Sent ${r.sent}${r.failed ? `; ${r.failed} failed and will be retried later (see the last error on each line)` : ""}.`,
        }),
      onError: (e) => setResult({ tone: "alert", text: e.message }),
    });
  };

  return (
    <Page
      title="Mail"
      lead="What Ropewalk sent, plan by plan: each message on its plan’s line with its delivery attempts, queued with the change that caused it. Open a message to read it. The newest 200 are shown; search to reach older ones."
    >
      {result && <Notice tone={result.tone}>{result.text}</Notice>}
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div className="min-w-72">
          <TextField
            label="Search mail"
            hint="Subject or recipient"
            type="search"
            value={text}
            onChange={(e) => setText(e.target.value)}
          />
        </div>
        <Button onClick={deliverNow} busy={deliver.isPending}>
          Deliver due mail now
        </Button>
      </div>
      {mail.isPending && <Loading label="Loading mail…" />}
      {mail.isError && (
        <Notice tone="alert" title="Could not load mail">
          {mail.error.message}
        </Notice>
      )}
      {mail.data && (
        <>
          <Panel title="Deliveries by plan">
            <DeliveryTimeline rows={mail.data.outbox} />
          </Panel>
          <Panel title={`Received by the local sink (${mail.data.messages.length})`}>
            <MailMessages messages={mail.data.messages} />
          </Panel>
        </>
      )}
    </Page>
  );
}
