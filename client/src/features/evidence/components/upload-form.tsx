import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { EVIDENCE_KIND_INFO } from "@shared/schemas/evidence";
import type { Evidence } from "@shared/schemas/evidence-api";
import { SubmitButton } from "@/components/button";
import { SelectField, TextAreaField, TextField, Field } from "@/components/field";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { useUploadEvidence } from "../api/evidence";
import { FILE_KINDS, type FileKind } from "../lib/kinds";
import { provenanceTemplate } from "../lib/provenance-template";
import { uploadFormSchema, type UploadFormValues } from "../lib/upload-form-schema";
import { uploadProblems } from "../lib/upload-problems";

type UploadFormProps = {
  planId: number;
  n: number;
  /** the revision's rotary fingerprint: what the evaluated model must have */
  fingerprint: string;
  /** the kind the first criterion that takes a file asks for */
  defaultKind: FileKind;
  /** the lengths the criteria name, one provenance bucket each */
  lengths: number[];
};

/** Upload one results file (our CSV for the kind, or the harness's results JSON) with what the run actually did. */
export function UploadForm({ planId, n, fingerprint, defaultKind, lengths }: UploadFormProps) {
  const upload = useUploadEvidence();
  const [problems, setProblems] = useState<string[]>([]);
  const [stored, setStored] = useState<Evidence | null>(null);
  const { register, handleSubmit, control, reset, formState } = useForm<UploadFormValues>({
    resolver: formResolver(uploadFormSchema),
    defaultValues: { kind: defaultKind, fingerprint, provenance: provenanceTemplate(lengths) },
  });
  const kind = useWatch({ control, name: "kind" });
  const info = EVIDENCE_KIND_INFO[kind as FileKind] ?? EVIDENCE_KIND_INFO[defaultKind];
  const errors = formState.errors;

  const onSubmit = handleSubmit((values) => {
    setProblems([]);
    setStored(null);
    const file = (values.file as FileList)[0]!;
    upload.mutate(
      { planId, n, file, kind: values.kind, fingerprint: values.fingerprint.trim(), provenance: values.provenance },
      {
        onSuccess: (r) => {
          setStored(r.evidence);
          reset({ kind: values.kind, fingerprint: values.fingerprint, provenance: values.provenance });
        },
        onError: (e) =>
          setProblems(
            isApiError(e) ? uploadProblems(e) : ["The upload did not reach the server; try again in a moment."],
          ),
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Upload evaluation results" className="flex flex-col gap-4">
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField label="What the file measures" error={errors.kind?.message} {...register("kind")}>
          {FILE_KINDS.map((k) => (
            <option key={k} value={k}>
              {EVIDENCE_KIND_INFO[k].label}
            </option>
          ))}
        </SelectField>
        <Field
          label="Results file"
          error={errors.file?.message}
          hint={`CSV with the header ${info.csvHeader?.join(",")}, or the evaluation harness's results JSON.`}
        >
          {({ id, describedBy, invalid }) => (
            <input
              id={id}
              type="file"
              accept=".csv,.json,text/csv,application/json"
              aria-describedby={describedBy}
              aria-invalid={invalid}
              className="text-note"
              {...register("file")}
            />
          )}
        </Field>
      </div>
      <p className="text-note text-ink-soft">{info.explains}</p>
      <TextField
        label="Rotary fingerprint of the model that was run"
        hint="Prefilled with this revision's; the server refuses results from a model rigged differently."
        error={errors.fingerprint?.message}
        className="font-mono text-note"
        spellCheck={false}
        {...register("fingerprint")}
      />
      <TextAreaField
        label="Provenance (JSON)"
        hint="What the harness did: engine and version, tokenizer, chat template, truncation side (left, right or none), generation budget, and per length bucket the actual mean and minimum token counts. A bucket short of a criterion's length marks it insufficient."
        error={errors.provenance?.message}
        rows={12}
        className="font-mono text-note"
        spellCheck={false}
        {...register("provenance")}
      />
      {problems.length > 0 && (
        <Notice tone="alert" title="Not stored">
          <ul className="list-disc pl-5" data-testid="upload-problems">
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </Notice>
      )}
      {stored && (
        <Notice tone="success">
          Stored {stored.fileName} as evidence #{stored.id}: {stored.rows.length} rows, SHA-256 {stored.checksum}.
        </Notice>
      )}
      <div>
        <SubmitButton busy={upload.isPending} busyLabel="Uploading…">
          Upload results
        </SubmitButton>
      </div>
    </form>
  );
}
