import { useQuery } from "@tanstack/react-query";
import { Button } from "@/components/button";
import { Loading, Notice } from "@/components/notice";
import { auditQueries } from "../api/queries";

const REASONS = {
  previous_hash_mismatch:
    "it no longer points at the entry before it, so an entry between them was taken out or replaced",
  hash_mismatch: "its contents no longer match the seal it was written with, so it was changed afterwards",
} as const;

/** Whether every entry is still tied to the one before it (the server re-checks the whole chain on request). */
export function ChainStatus() {
  const chain = useQuery(auditQueries.chain());
  if (chain.isPending) return <Loading label="Checking the seals on every entry…" />;
  if (chain.isError)
    return (
      <Notice tone="alert" title="Could not check the trail's seals">
        {chain.error.message}
      </Notice>
    );
  const r = chain.data;
  const again = (
    <Button variant="quiet" onClick={() => void chain.refetch()} disabled={chain.isFetching}>
      {chain.isFetching ? "Checking…" : "Check again"}
    </Button>
  );
  if (r.ok) {
    return (
      <div className="flex flex-wrap items-center gap-3" data-testid="chain-status">
        <Notice tone="success" title="Trail intact">
          All {r.count.toLocaleString("en")} entries are sealed and each is tied to the one before it.
        </Notice>
        {again}
      </div>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-3" data-testid="chain-status">
      <Notice tone="alert" title="The trail was altered outside Ropewalk">
        Entry #{r.brokenAt!.id} breaks the chain: {REASONS[r.brokenAt!.reason]}. {r.count.toLocaleString("en")} entries
        before it
        {r.brokenAt!.previousId != null ? ` (up to #${r.brokenAt!.previousId})` : ""} still hold. Ask whoever
        administers the database.
      </Notice>
      {again}
    </div>
  );
}
