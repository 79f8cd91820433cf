import { useRef, useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { useQuery } from "@tanstack/react-query";
import { formResolver } from "@/lib/form-resolver";
import { decisionRequestSchema } from "@shared/schemas/plans";
import { DECISION_WORDS, STATE_WORDS, passesText } from "@shared/review-words";
import { Button, SubmitButton } from "@/components/button";
import { Field } from "@/components/field";
import { RadioColumn, type RadioOption } from "@/components/radio";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { ExportTargets } from "@/components/export-targets";
import { LabelledCode } from "@/components/labelled-code";
import { useModalOnMount } from "@/lib/use-modal-on-mount";
import { useDecide } from "../api/decide";
import { plansQueries } from "../api/queries";
import { exportRequestOf } from "../lib/export-request";

export type DecisionTarget = {
  planId: number;
  title: string;
  revision: number;
  contentHash: string;
  approvals: number;
  requiredApprovals: number;
};

// Sending a revision back without saying why leaves its author guessing; the server allows it, this form does not.
const decisionFormSchema = decisionRequestSchema
  .omit({ contentHash: true })
  .refine((d) => d.decision === "approve" || d.comment.trim().length > 0, {
    path: ["comment"],
    message: "Say what to re-lay before sending it back.",
  });

/** The two findings, in the review words (shared/review-words.ts). */
const FINDINGS: RadioOption<"approve" | "request_changes">[] = [
  { value: "approve", label: `${DECISION_WORDS.approve.verb}: the plan is sound to tune with` },
  {
    value: "request_changes",
    label: `${DECISION_WORDS.request_changes.verb}: its author lays a new revision with what you note`,
  },
];

type DecisionDialogProps = { target: DecisionTarget; onClose: () => void; onDecided: (state: string) => void };

/** Pass or send back one revision at inspection; shows the exact hash the decision signs. */
export function DecisionDialog({ target, onClose, onDecided }: DecisionDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const decide = useDecide();
  const [error, setError] = useState<string | null>(null);
  // The hash shown when the dialog opened is the one signed, even if the page refreshes underneath.
  const [shownHash] = useState(target.contentHash);
  const { register, handleSubmit, control, formState } = useForm({
    resolver: formResolver(decisionFormSchema),
    defaultValues: { decision: "approve" as const, comment: "" },
  });
  const decision = useWatch({ control, name: "decision" });
  const revision = useQuery(plansQueries.revision(target.planId, target.revision));

  useModalOnMount(ref);

  const onSubmit = handleSubmit((body) => {
    setError(null);
    decide.mutate(
      { planId: target.planId, n: target.revision, body: { ...body, contentHash: shownHash } },
      {
        onSuccess: (r) => onDecided(r.state),
        onError: (e) => {
          if (isApiError(e) && e.code === "hash_mismatch")
            setError(
              `Not recorded: the revision changed after you opened it, so the hash above is no longer its content. Close this, read the revision again and decide on what it says now.`,
            );
          else if (isApiError(e) && e.status === 409 && e.fields?.state)
            setError(
              `Not recorded: the revision is now ${STATE_WORDS[e.fields.state as keyof typeof STATE_WORDS] ?? e.fields.state}. ${e.message}.`,
            );
          else setError(isApiError(e) ? e.message : "Something went wrong. Try again.");
        },
      },
    );
  });

  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby="decision-title"
      className="m-auto max-h-[calc(100vh-2rem)] w-[min(56rem,calc(100vw-2rem))] overflow-y-auto rounded-lg border border-rule bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40"
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 p-4 sm:p-6" aria-label="Decision">
        <h2 id="decision-title" className="text-title font-semibold">
          Inspect {target.title}, revision {target.revision}
        </h2>
        <div className="rounded-md border border-hemp/40 bg-hemp-pale/50 px-3 py-2">
          <p className="text-note font-semibold tracking-wide text-hemp-dark uppercase">
            You are signing this content hash
          </p>
          <code className="block text-body break-all" data-testid="hash-to-sign">
            {shownHash}
          </code>
          <p className="mt-1 text-note text-ink-soft">
            SHA-256 of the revision’s canonical content: every input, the engine’s figures and the budget sheet. So far{" "}
            {passesText(target.approvals, target.requiredApprovals)}.
          </p>
          {revision.data?.rotaryFingerprint && (
            <LabelledCode
              label="Rotary fingerprint"
              value={revision.data.rotaryFingerprint}
              testId="fingerprint-to-sign"
              className="mt-1"
            />
          )}
        </div>
        <section className="flex flex-col gap-2" aria-label="How each stack reads this revision">
          <h3 className="text-body font-semibold">How each stack reads this revision</h3>
          <ExportTargets request={revision.data ? exportRequestOf(revision.data.content) : null} matrixOnly />
        </section>
        {error && <Notice tone="alert">{error}</Notice>}
        <Controller
          control={control}
          name="decision"
          render={({ field }) => (
            <RadioColumn
              name={field.name}
              title="Your finding"
              options={FINDINGS}
              value={field.value}
              onChange={field.onChange}
              align="start"
            />
          )}
        />
        <Field
          label={decision === "approve" ? "Note (optional)" : "What to re-lay (required)"}
          error={formState.errors.comment?.message}
        >
          {({ id, describedBy, invalid }) => (
            <textarea
              id={id}
              rows={4}
              aria-describedby={describedBy}
              aria-invalid={invalid}
              className="w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body focus:border-seaglass focus:outline-2 focus:outline-seaglass/30"
              {...register("comment")}
            />
          )}
        </Field>
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="secondary" onClick={() => ref.current?.close()}>
            Cancel
          </Button>
          <SubmitButton busy={decide.isPending} busyLabel="Recording…">
            {decision === "approve" ? DECISION_WORDS.approve.submit : DECISION_WORDS.request_changes.submit}
          </SubmitButton>
        </div>
      </form>
    </dialog>
  );
}
