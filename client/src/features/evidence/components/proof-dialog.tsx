import { useRef, useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { z } from "zod";
import { PROOF_STATES, type ProofState } from "@shared/schemas/evidence-api";
import { Button, SubmitButton } from "@/components/button";
import { TextAreaField } from "@/components/field";
import { RadioColumn } from "@/components/radio";
import { Notice } from "@/components/notice";
import { isApiError } from "@/lib/api-client";
import { useModalOnMount } from "@/lib/use-modal-on-mount";
import { useDecideProof } from "../api/evidence";

export type ProofTarget = {
  planId: number;
  revision: number;
  contentHash: string;
  /** the evidence the page shows: exactly what the approver looked at */
  evidenceIds: number[];
  /** every criterion passes on that evidence (and there is at least one) */
  allPass: boolean;
  /** "#2 (fail), #3 (no_data)": what stands in the way of proven */
  open: string;
  /** the button the approver pressed */
  verdict: ProofState;
};

const proofFormSchema = z
  .object({ verdict: z.enum(PROOF_STATES), reason: z.string().max(4000) })
  .refine((d) => d.verdict === "proven" || d.reason.trim().length > 0, {
    path: ["reason"],
    message: "Say why the revision is not proven: which criterion fell short, and by how much.",
  });

/** Why the server did not record the decision, in words that say what to do next. */
function refusal(e: unknown): string {
  if (!isApiError(e)) return "The decision did not reach the server; try again in a moment.";
  if (e.code === "evidence_changed")
    return "Not recorded: evidence was added or removed after you opened this. Close it, read the criteria again and decide on what is there now.";
  if (e.code === "hash_mismatch")
    return "Not recorded: the revision's content hash is no longer the one shown here. Close this and read the revision again.";
  return `Not recorded: ${e.message}.`;
}

type Props = { target: ProofTarget; onClose: () => void; onDecided: (verdict: ProofState) => void };

/** An approver's proof decision: signs the content hash and the evidence ids shown when the dialog opened. */
export function ProofDialog({ target, onClose, onDecided }: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  const decide = useDecideProof();
  const [error, setError] = useState<string | null>(null);
  // What was on screen when the dialog opened is what gets signed, even if the page refreshes underneath.
  const [shown] = useState({ contentHash: target.contentHash, evidenceIds: target.evidenceIds });
  const { register, handleSubmit, control, formState } = useForm({
    resolver: formResolver(proofFormSchema),
    defaultValues: { verdict: target.allPass ? target.verdict : ("unproven" as const), reason: "" },
  });
  const verdict = useWatch({ control, name: "verdict" });

  useModalOnMount(ref);

  const onSubmit = handleSubmit((body) => {
    setError(null);
    decide.mutate(
      { planId: target.planId, n: target.revision, body: { ...body, reason: body.reason.trim(), ...shown } },
      { onSuccess: (r) => onDecided(r.proof), onError: (e) => setError(refusal(e)) },
    );
  });

  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby="proof-title"
      className="m-auto max-h-[calc(100vh-2rem)] w-[min(44rem,calc(100vw-2rem))] overflow-y-auto rounded-lg border border-rule bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40"
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 p-6" aria-label="Proof decision">
        <h2 id="proof-title" className="text-title font-semibold">
          Proof-test revision {target.revision}
        </h2>
        <div className="rounded-md border border-hemp/40 bg-hemp-pale/50 px-3 py-2">
          <p className="text-note font-semibold tracking-wide text-hemp-dark uppercase">You are signing</p>
          <p className="text-note text-ink-soft">Content hash</p>
          <code className="block text-body break-all" data-testid="proof-hash-to-sign">
            {shown.contentHash}
          </code>
          <p className="mt-1 text-note text-ink-soft">
            Evidence read:{" "}
            <span data-testid="proof-evidence-to-sign">
              {shown.evidenceIds.length ? shown.evidenceIds.map((id) => `#${id}`).join(", ") : "none"}
            </span>
          </p>
        </div>
        {error && <Notice tone="alert">{error}</Notice>}
        <Controller
          control={control}
          name="verdict"
          render={({ field }) => (
            <RadioColumn
              name={field.name}
              title="Verdict"
              options={[
                {
                  value: "proven",
                  label: "Proven: every criterion holds on this evidence",
                  // Proven is open only when every criterion passes on the evidence shown.
                  disabled: !target.allPass,
                  description: target.allPass ? undefined : `Not open: criteria ${target.open} do not hold yet.`,
                },
                { value: "unproven", label: "Not proven: the evaluations fall short" },
              ]}
              value={field.value}
              onChange={field.onChange}
            />
          )}
        />
        <TextAreaField
          label={verdict === "proven" ? "Comment (optional)" : "Why it is not proven"}
          rows={3}
          error={formState.errors.reason?.message}
          {...register("reason")}
        />
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="secondary" onClick={() => ref.current?.close()}>
            Cancel
          </Button>
          <SubmitButton busy={decide.isPending} busyLabel="Signing…">
            {verdict === "proven" ? "Sign as proven" : "Sign as not proven"}
          </SubmitButton>
        </div>
      </form>
    </dialog>
  );
}
