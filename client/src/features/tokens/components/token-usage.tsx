import { Button } from "@/components/button";
import { useCopyText } from "@/lib/use-copy-text";
import { exportCurlExample } from "../curl-example";

export function TokenUsage() {
  const { copied, copy } = useCopyText();
  const text = exportCurlExample(window.location.origin);
  return (
    <section aria-label="Using a token" className="flex flex-col gap-2">
      <h3 className="text-body font-semibold text-ink">Using a token</h3>
      <p className="max-w-prose text-body text-ink-soft">
        A job fetches the signed configuration of a plan&apos;s approved revision like this (42 is the plan&apos;s
        number, from its page address; <code>?target=</code> picks the stack, or leave it out for the config patch):
      </p>
      <pre className="max-w-full overflow-x-auto rounded border border-rule bg-paper-deep p-3 text-note">
        <code data-testid="token-curl">{text}</code>
      </pre>
      <div className="flex items-center gap-3">
        <Button variant="secondary" size="sm" onClick={() => copy(text)}>
          Copy the curl line
        </Button>
        {copied === "yes" && <span className="text-note text-ink-soft">Copied.</span>}
        {copied === "failed" && (
          <span className="text-note text-ink-soft">Copying was refused; select it by hand.</span>
        )}
      </div>
    </section>
  );
}
