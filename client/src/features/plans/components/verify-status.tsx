import type { VerifyResponse } from "@shared/schemas/plans";
import { Notice } from "@/components/notice";

/**
 * The server recomputes the content hash from what it stores and checks every decision's signed hash and signature.
 * A match is said quietly; a failure is an alert, because the figures on screen are no longer the ones that were signed.
 */
export function VerifyStatus({ result, error }: { result?: VerifyResponse; error?: Error | null }) {
  if (error)
    return (
      <Notice tone="alert" title="Could not check this revision’s integrity">
        {error.message}
      </Notice>
    );
  if (!result)
    return (
      <p className="text-note text-ink-soft" role="status">
        Checking integrity…
      </p>
    );
  if (result.ok) {
    return (
      <div
        role="status"
        data-testid="verify-status"
        data-ok="true"
        className="flex flex-wrap items-center gap-2 rounded-md border border-seaglass/40 bg-seaglass-pale px-3 py-2 text-body"
      >
        <span aria-hidden className="size-2.5 rounded-full bg-seaglass" />
        <span className="font-semibold text-seaglass-dark">Intact.</span>
        <span>
          The stored content still hashes to <code className="break-all">{result.storedHash}</code>, and every
          decision’s server signature holds.
        </span>
      </div>
    );
  }
  if (!result.hashIntact) {
    return (
      <div data-testid="verify-status" data-ok="false">
        <Notice tone="alert" title="Integrity failure: this revision no longer matches its hash">
          <p>
            The content stored for revision {result.number} hashes to something other than what was recorded, so it is
            not what was drafted or signed. Exports are refused; tell an admin.
          </p>
          <p className="mt-1 text-note break-all">
            Recorded: <code>{result.storedHash}</code>
          </p>
          <p className="text-note break-all">
            Computed now: <code>{result.computedHash}</code>
          </p>
        </Notice>
      </div>
    );
  }
  return (
    <div data-testid="verify-status" data-ok="false">
      <Notice tone="alert" title="Integrity failure: the signatures on this revision do not hold">
        <p>
          The content matches its recorded hash, but the signed decisions do not back it, so it is not what was
          approved. Exports are refused; tell an admin.
        </p>
        <ul className="mt-1 list-disc pl-5 text-note">
          {result.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      </Notice>
    </div>
  );
}
