import { useState } from "react";
import type { TargetExportBody as CompiledTarget } from "@shared/schemas/exports";
import { Button } from "./button";
import { SelectField } from "./field";
import { downloadText } from "@/lib/download";
import { useCopyText } from "@/lib/use-copy-text";

const fileName = (t: CompiledTarget) =>
  `ropewalk-${t.id}${t.artifact?.kind === "config-merge-patch" ? "-config-patch.json" : "-launch.txt"}`;

/**
 * The export menu: pick a stack, see the exact bytes its artifact downloads as (a config.json merge patch or the
 * launch line), copy them or download them.
 */
export function TargetArtifacts({ targets }: { targets: CompiledTarget[] }) {
  const offered = targets.filter((t) => t.artifact);
  const [id, setId] = useState<string>(offered[0]?.id ?? "");
  const { copied, copy } = useCopyText();
  const shown = offered.find((t) => t.id === id) ?? offered[0];
  if (!shown?.artifact) return <p className="text-body text-ink-soft">No stack can carry this plan.</p>;
  const text = shown.artifact.text;
  const kind = shown.artifact.kind === "config-merge-patch" ? "config.json merge patch" : "launch line";
  return (
    <div className="flex flex-col gap-2" data-testid="target-artifacts">
      <div className="flex flex-wrap items-end gap-3">
        <div className="w-80">
          <SelectField label="Stack to rig" value={shown.id} onChange={(e) => setId(e.target.value)}>
            {offered.map((t) => (
              <option key={t.id} value={t.id}>
                {t.label}
                {t.conformance.status === "unsupported" ? " (closest workaround)" : ""}
              </option>
            ))}
          </SelectField>
        </div>
        <Button
          variant="secondary"
          size="sm"
          onClick={() => copy(text)}
          aria-label={`Copy the ${kind} for ${shown.label}`}
        >
          Copy
        </Button>
        <Button
          variant="secondary"
          size="sm"
          onClick={() => downloadText(text, fileName(shown), "application/octet-stream")}
          aria-label={`Download the ${kind} for ${shown.label}`}
        >
          Download
        </Button>
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
      </div>
      <p className="text-note font-semibold text-ink-soft">{kind}</p>
      <pre
        className="max-h-64 overflow-auto rounded-md border border-rule bg-paper-deep px-3 py-2 text-note whitespace-pre-wrap"
        data-testid="target-artifact-text"
      >
        {text}
      </pre>
    </div>
  );
}
