import { useId, useState } from "react";
import type { ImportResponse, ModelProfile } from "@shared/schemas/models";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { useImportConfig } from "../api/import-config";
import { previewInput } from "./blank-profile";
import { CurrentScalingNote } from "./current-scaling";
import { ProfileLayerGroups } from "./profile-layer-groups";
import { ImportWarnings } from "./import-warnings";
import { ProfileForm } from "./profile-form";

const MAX_BYTES = 1024 * 1024;

/** Why a file could not be read, in words: the server names the file problem or each missing key. */
function uploadProblem(error: unknown): { title: string; lines: string[] } {
  if (isApiError(error) && error.code === "too_large")
    return {
      title: "The file is too large",
      lines: [
        "Ropewalk reads config files up to 1 MB; a config.json is usually a few KB. Check you picked the right file.",
      ],
    };
  if (isApiError(error) && error.fields) {
    const lines = Object.entries(error.fields).map(([key, msg]) => (key === "file" ? msg : `${key}: ${msg}`));
    return { title: error.message, lines };
  }
  return { title: "The file could not be read", lines: [error instanceof Error ? error.message : String(error)] };
}

/**
 * Upload a config.json, see what Ropewalk read from it and every warning, correct the values, then save.
 * Nothing is stored until Save: the preview is parse-only on the server.
 */
export function ImportConfig({ onSaved }: { onSaved: (model: ModelProfile) => void }) {
  const inputId = useId();
  const preview = useImportConfig();
  const save = useImportConfig();
  const [file, setFile] = useState<File | null>(null);
  const [parsed, setParsed] = useState<{ file: File; result: ImportResponse } | null>(null);
  const [localProblem, setLocalProblem] = useState<string | null>(null);

  const choose = (picked: File | undefined) => {
    setParsed(null);
    setLocalProblem(null);
    preview.reset();
    if (!picked) return setFile(null);
    setFile(picked);
    if (picked.size > MAX_BYTES)
      return setLocalProblem(
        `${picked.name} is ${(picked.size / MAX_BYTES).toFixed(1)} MB; Ropewalk reads config files up to 1 MB.`,
      );
    preview.mutate({ file: picked, save: false }, { onSuccess: (result) => setParsed({ file: picked, result }) });
  };

  const problem = preview.isError ? uploadProblem(preview.error) : null;

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-col gap-1">
        <label htmlFor={inputId} className="text-note font-semibold text-ink">
          config.json to import
        </label>
        <input
          id={inputId}
          type="file"
          accept=".json,application/json"
          onChange={(e) => choose(e.target.files?.[0])}
          className="text-body file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-paper file:px-3 file:py-1.5 file:text-body file:font-medium hover:file:border-hemp"
        />
        <p className="text-note text-ink-soft">
          The model's configuration file (up to 1 MB). Nothing is saved until you press Save.
        </p>
      </div>
      {preview.isPending && (
        <p role="status" className="text-body text-ink-soft">
          Reading {file?.name}…
        </p>
      )}
      {localProblem && (
        <Notice tone="alert" title="The file is too large">
          {localProblem}
        </Notice>
      )}
      {problem && (
        <Notice tone="alert" title={problem.title}>
          <ul className="list-disc pl-5">
            {problem.lines.map((l) => (
              <li key={l}>{l}</li>
            ))}
          </ul>
        </Notice>
      )}
      {parsed && (
        <>
          <ImportWarnings warnings={parsed.result.warnings} title="Read these before saving" />
          <CurrentScalingNote scaling={parsed.result.profile.currentScaling} />
          <ProfileLayerGroups groups={parsed.result.profile.layerGroups} />
          <div className="flex flex-col gap-2">
            <h3 className="text-lead font-semibold text-ink">What Ropewalk read from {parsed.file.name}</h3>
            <p className="text-body text-ink-soft">
              Correct anything the warnings point at; your edits are saved on top of the file, which is kept with the
              profile.
            </p>
          </div>
          <ProfileForm
            key={`${parsed.file.name}-${parsed.file.lastModified}-${parsed.file.size}`}
            ariaLabel="Imported profile"
            defaultValues={previewInput(parsed.result.profile)}
            submitLabel="Save profile"
            busyLabel="Saving…"
            busy={save.isPending}
            onSubmit={async (_values, edited) => {
              const result = await save.mutateAsync({ file: parsed.file, save: true, overrides: edited });
              if (result.saved) onSaved(result.saved);
            }}
          />
        </>
      )}
    </div>
  );
}
