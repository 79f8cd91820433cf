import { useState } from "react";
import { Button } from "@/components/button";
import { Notice } from "@/components/notice";

/** The secret of a just-made token, with a copy button; it disappears when dismissed and cannot be shown again. */
export function NewTokenSecret({ name, token, onDismiss }: { name: string; token: string; onDismiss: () => void }) {
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(token);
      setCopied("yes");
    } catch {
      setCopied("failed");
    }
  };
  return (
    <Notice tone="alert" title={`Copy the secret of “${name}” now`}>
      <p>
        This is the only time Ropewalk shows it: only a hash of it is kept. Anyone holding it can read every plan you
        can read, until you revoke it.
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <code
          data-testid="new-token-secret"
          className="rounded border border-rule bg-white px-2 py-1 text-body break-all text-ink select-all"
        >
          {token}
        </code>
        <Button size="sm" variant="secondary" onClick={copy}>
          Copy secret
        </Button>
        <Button size="sm" variant="quiet" onClick={onDismiss}>
          I have stored it
        </Button>
      </div>
      {copied === "yes" && <p className="mt-1 text-note text-ink">Copied to the clipboard.</p>}
      {copied === "failed" && (
        <p className="mt-1 text-note">The browser refused the clipboard; select the secret and copy it by hand.</p>
      )}
      <p className="mt-2 text-note">
        Use it as <code>Authorization: Bearer …</code> on read-only requests, such as the approved plan’s export.
      </p>
    </Notice>
  );
}
