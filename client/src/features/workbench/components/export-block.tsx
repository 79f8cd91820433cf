import type { ConfigPatch } from "@shared/schemas/analysis";
import { Button } from "@/components/button";
import { useCopyText } from "@/lib/use-copy-text";

/**
 * The config.json keys a method needs (rope_scaling and friends), ready to paste, with a copy button. For a model with
 * multimodal sections the block holds them too (mrope_section, mrope_interleaved: server/engine/methods/common.ts).
 */
export function ExportBlock({
  patch,
  label,
  heading = "config.json keys",
  testId = "export-block",
}: {
  patch: ConfigPatch;
  label: string;
  heading?: string;
  testId?: string;
}) {
  const text = JSON.stringify(patch, null, 2);
  const { copied, copy } = useCopyText();
  return (
    <div className="flex flex-col gap-1">
      <div className="flex items-center justify-between gap-2">
        <span className="text-note font-semibold text-ink-soft">{heading}</span>
        <span className="flex items-center gap-2">
          {copied === "yes" && (
            <span className="text-note text-seaglass-dark" role="status">
              Copied
            </span>
          )}
          {copied === "failed" && (
            <span className="text-note text-signal" role="status">
              The browser refused; select the text instead
            </span>
          )}
          <Button
            variant="secondary"
            size="sm"
            onClick={() => copy(text)}
            aria-label={`Copy the config keys of ${label}`}
          >
            Copy
          </Button>
        </span>
      </div>
      <pre
        className="max-h-56 overflow-auto rounded-md border border-rule bg-paper-deep px-3 py-2 text-note"
        data-testid={testId}
      >
        {text}
      </pre>
    </div>
  );
}
