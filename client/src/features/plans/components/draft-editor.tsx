import { useState, type ReactNode } from "react";
import { FormProvider, useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import type { RevisionResponse } from "@shared/schemas/plans";
import type { RevisionValues, UpdateRevisionRequest } from "@shared/schemas/plans";
import { Button, SubmitButton } from "@/components/button";
import { Notice } from "@/components/notice";
import { LeaveGuard } from "@/components/leave-guard";
import { isApiError } from "@/lib/api-client";
import { shortHash } from "@/lib/format";
import { useUpdateRevision } from "../api/update-revision";
import { actionErrorText } from "../lib/action-error";
import { editRevisionFormSchema, revisionValuesOf } from "../lib/form-values";
import { invalidSummary, placeServerErrors } from "../lib/server-errors";
import { rotaryShapeOf } from "@shared/profile-shapes";
import { RevisionFields } from "./form/revision-fields";

type DraftEditorProps = {
  planId: number;
  revision: RevisionResponse;
  /** Re-read the revision from the server (after a 409: someone saved it since it was read). */
  onReload: () => void;
  onSaved?: () => void;
  /** Rendered after the stages, inside the form, so it can read and set `revision.*` (the budget sheet's place). */
  afterStages?: ReactNode;
};

/**
 * Only the fields edited since the last save go in the PUT (the audit trail then names them). A budget sheet
 * cleared back to "no accelerator" is sent as null, which is how the server removes it.
 */
function changedFields(
  values: RevisionValues,
  dirty: Partial<Record<keyof RevisionValues, unknown>> | undefined,
): Omit<UpdateRevisionRequest, "version"> {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(dirty ?? {}) as (keyof RevisionValues)[])
    out[key] = values[key] ?? (key === "budget" ? null : undefined);
  return out as Omit<UpdateRevisionRequest, "version">;
}

type Problem = { kind: "stale" | "refused"; text: string };

/**
 * Edits one draft. Each save carries the version this page read last; if someone saved in between,
 * the server answers 409 and nothing changes, and the page says so plainly.
 */
export function DraftEditor({ planId, revision, onReload, onSaved, afterStages }: DraftEditorProps) {
  const update = useUpdateRevision();
  const [version, setVersion] = useState(revision.version);
  const [problem, setProblem] = useState<Problem | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const form = useForm({
    resolver: formResolver(editRevisionFormSchema),
    defaultValues: { revision: revisionValuesOf(revision.content) },
  });
  // Read during render so react-hook-form keeps dirtyFields up to date (its form state is a subscription proxy).
  const { dirtyFields } = form.formState;
  const m = revision.content.model;
  const model = rotaryShapeOf(m);

  const onSubmit = form.handleSubmit(
    ({ revision: values }) => {
      setProblem(null);
      setSaved(null);
      const changes = changedFields(values, dirtyFields.revision);
      if (Object.keys(changes).length === 0) {
        setSaved("Nothing changed since the last save.");
        return;
      }
      update.mutate(
        { id: planId, n: revision.number, changes: { version, ...changes } },
        {
          onSuccess: (r) => {
            setVersion(r.version);
            setSaved(`Saved as version ${r.version}; content hash ${shortHash(r.contentHash)}.`);
            form.reset(form.getValues(), { keepValues: true });
            onSaved?.();
          },
          onError: (e) => {
            if (isApiError(e) && e.status === 409 && e.fields?.version) {
              setProblem({
                kind: "stale",
                text: `This draft changed since you read it (${e.fields.version}; you had version ${version}). Reload to see the saved values; your unsaved edits here will be lost.`,
              });
            } else if (isApiError(e) && e.status === 409) {
              setProblem({ kind: "refused", text: actionErrorText(e) });
            } else {
              const text = placeServerErrors(e, form.setError);
              if (text) setProblem({ kind: "refused", text });
            }
          },
        },
      );
    },
    (errors) => {
      setSaved(null);
      setProblem({ kind: "refused", text: invalidSummary(errors) });
    },
  );

  return (
    <FormProvider {...form}>
      <form
        onSubmit={onSubmit}
        noValidate
        className="flex flex-col gap-6"
        aria-label={`Edit revision ${revision.number}`}
      >
        <p className="text-note text-ink-soft">
          Editing version {version} of revision {revision.number}. The model is frozen in the revision: {m.name},
          trained on {m.trainedContext} tokens.
        </p>
        {problem?.kind === "stale" && (
          <Notice tone="alert" title="Changed since you read it — reload">
            <p>{problem.text}</p>
            <div className="mt-2">
              <Button variant="secondary" size="sm" onClick={onReload}>
                Reload the saved draft
              </Button>
            </div>
          </Notice>
        )}
        {problem?.kind === "refused" && (
          <Notice tone="alert" title="Not saved">
            {problem.text}
          </Notice>
        )}
        {saved && <Notice tone="success">{saved}</Notice>}
        <LeaveGuard when={form.formState.isDirty && !update.isPending} what={`Revision ${revision.number}`} />
        <RevisionFields
          model={model}
          afterStages={afterStages}
          lineage={
            m.lineage
              ? {
                  pretrainedContext: m.trainedContext,
                  servedContext: m.lineage.servedContext,
                  shipped: m.lineage.shipped,
                }
              : null
          }
        />
        <div className="flex flex-wrap gap-2 border-t border-rule pt-4">
          <SubmitButton busy={update.isPending} busyLabel="Saving…">
            Save draft
          </SubmitButton>
        </div>
      </form>
    </FormProvider>
  );
}
