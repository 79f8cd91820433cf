import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import type { ReviewQueueItem } from "@shared/schemas/plans";
import { Page, Panel } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { useRefreshPlan } from "@/features/plans/api/workflow";
import { plansQueries } from "@/features/plans/api/queries";
import { DecisionDialog } from "@/features/plans/components/decision-dialog";
import { ReviewQueueTable } from "@/features/plans/components/review-queue-table";
import { Pager } from "@/components/pager";

const SAID: Record<string, string> = {
  approved: "passed and signed; its export is ready",
  in_review: "passed by you; it waits for more inspectors",
  changes_requested: "sent back to the walk, with your note to its author",
};

export function ReviewRoute() {
  const [page, setPage] = useState(1);
  const queue = useQuery(plansQueries.reviewQueue(page));
  const refreshPlan = useRefreshPlan();
  const [deciding, setDeciding] = useState<ReviewQueueItem | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  return (
    <Page
      title="Inspection"
      lead="Revisions sent to inspection and waiting for you. You sign the exact content hash shown; a later change would need a new revision."
    >
      {notice && <Notice tone="success">{notice}</Notice>}
      <Panel title="On your bench">
        {queue.isPending && <Loading label="Loading the queue…" />}
        {queue.isError && (
          <Notice tone="alert" title="Could not load the queue">
            {queue.error.message}
          </Notice>
        )}
        {queue.data && (
          <div className="flex flex-col gap-3">
            <ReviewQueueTable
              items={queue.data.items}
              onDecide={(item) => {
                setNotice(null);
                setDeciding(item);
              }}
            />
            {(queue.data.total > queue.data.pageSize || page > 1) && (
              <Pager
                page={queue.data.page}
                pageSize={queue.data.pageSize}
                total={queue.data.total}
                totalCapped={queue.data.totalCapped}
                onPage={setPage}
                noun="Revisions"
              />
            )}
          </div>
        )}
      </Panel>
      {deciding && (
        <DecisionDialog
          target={deciding}
          onClose={() => setDeciding(null)}
          onDecided={(state) => {
            setNotice(`${deciding.title}, revision ${deciding.revision}: ${SAID[state] ?? state}.`);
            void refreshPlan(deciding.planId);
            setDeciding(null);
          }}
        />
      )}
    </Page>
  );
}
