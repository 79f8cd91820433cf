import { Button } from "@/components/button";
import { Notice } from "@/components/notice";
import { sig, tokens } from "../figures";
import { useSmallestBase } from "../hooks/use-smallest-base";

/** Live search for the smallest base on the grid that supports the target, with progress and Cancel. */
export function SmallestBase({
  rotaryDim,
  targetContext,
  currentBase,
}: {
  rotaryDim: number;
  targetContext: number;
  currentBase: number;
}) {
  const { query, progress, cancelled, cancel, restart } = useSmallestBase(rotaryDim, targetContext);
  const examined = progress && "candidatesExamined" in progress ? progress : null;

  if (query.isSuccess) {
    const r = query.data;
    return (
      <div className="flex flex-col gap-1" data-testid="smallest-base">
        {r.smallestBase === null ? (
          <p>
            No base on the grid (up to {sig(r.grid.to, 3)}) supports {tokens(targetContext)} tokens.
          </p>
        ) : (
          <p>
            Smallest base that supports {tokens(targetContext)} tokens:{" "}
            <strong className="tabular-nums">{sig(r.smallestBase, 4)}</strong>
            {r.smallestBase <= currentBase
              ? " — the current base is at least that."
              : ` — the current base ${sig(currentBase, 4)} is below it.`}
          </p>
        )}
        <p className="text-note text-ink-soft">
          Grid {sig(r.grid.from, 3)} to {sig(r.grid.to, 3)}, {r.grid.perDecade} bases per decade, tried from the bottom
          up; {r.candidatesExamined} of {r.candidatesTotal} tried.
        </p>
      </div>
    );
  }
  if (query.isError) {
    return (
      <Notice tone="alert" title="The search did not finish">
        <p>{query.error.message}</p>
        <Button variant="secondary" size="sm" onClick={restart} className="mt-2">
          Search again
        </Button>
      </Notice>
    );
  }
  if (cancelled) {
    return (
      <div className="flex items-center gap-3" data-testid="smallest-base">
        <p className="text-ink-soft">
          Search cancelled{examined ? ` after ${examined.candidatesExamined} bases` : ""}.
        </p>
        <Button variant="secondary" size="sm" onClick={restart}>
          Search again
        </Button>
      </div>
    );
  }
  const share = examined ? examined.candidatesExamined / examined.total : 0;
  return (
    <div className="flex flex-col gap-2" data-testid="smallest-base">
      <div className="flex items-center gap-3">
        <progress className="h-2 w-48 accent-hemp" max={1} value={share} aria-label="Bases tried so far" />
        <span className="text-note text-ink-soft tabular-nums" role="status">
          {examined ? `${examined.candidatesExamined} of up to ${examined.total} bases tried` : "Starting the search…"}
        </span>
        <Button variant="secondary" size="sm" onClick={cancel}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
