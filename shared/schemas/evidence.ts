import { z } from "zod";

/**
 * Evaluation evidence (issue 12): the fixed kinds of acceptance criterion and of uploaded evidence, what each measures,
 * and the CSV header each kind's file carries. The plan form shows `explains` beside the kind picker.
 */
export const EVIDENCE_KINDS = ["passkey", "needle", "ruler", "perplexity", "short_regression", "parity"] as const;
export type EvidenceKind = (typeof EVIDENCE_KINDS)[number];
export const evidenceKindSchema = z.enum(EVIDENCE_KINDS, {
  error: () => `kind must be one of ${EVIDENCE_KINDS.join(", ")}`,
});

export interface EvidenceKindInfo {
  label: string;
  explains: string;
  /** the header row of our CSV format for this kind; null when the kind takes no file of ours (parity) */
  csvHeader: readonly string[] | null;
  /** the figure a criterion of this kind compares with its threshold */
  observed: string;
}

export const EVIDENCE_KIND_INFO: Record<EvidenceKind, EvidenceKindInfo> = {
  passkey: {
    label: "Passkey retrieval",
    explains:
      "A random passkey hidden in filler text must be repeated back. Accuracy at one length: correct answers over trials.",
    csvHeader: ["context_length", "depth", "trials", "correct"],
    observed: "Σ correct ÷ Σ trials over the rows at the criterion's length (a fraction from 0 to 1)",
  },
  needle: {
    label: "Needle recall grid",
    explains:
      "A fact placed at a depth (0 = start, 1 = end) of a haystack of a given length must be recalled. Recall of each length × depth cell up to the criterion's length, taken as the minimum or the mean of the cells.",
    csvHeader: ["context_length", "depth", "trials", "correct"],
    observed: "min or mean over cells with length ≤ the criterion's length of correct ÷ trials (a fraction)",
  },
  ruler: {
    label: "Synthetic task suite",
    explains:
      "Scores of synthetic long-context tasks (retrieval, multi-hop tracing, aggregation) per length, as fractions from 0 to 1. The effective length is the longest length up to which the mean task score stays at or above the threshold.",
    csvHeader: ["context_length", "task", "score"],
    observed: "mean score over tasks at the criterion's length; the effective length is reported beside it",
  },
  perplexity: {
    label: "Perplexity",
    explains:
      "Perplexity of held-out long documents at a length, or its ratio to the perplexity at the trained length (ratio near 1: no degradation). Perplexity alone does not show that retrieval works; pair it with a retrieval criterion.",
    csvHeader: ["context_length", "perplexity"],
    observed: "perplexity at the criterion's length, or that over the perplexity at the trained length",
  },
  short_regression: {
    label: "Short-context regression",
    explains:
      "Scores on named short-context benchmarks for the base model and the tuned model. The loss (baseline − tuned) on each named benchmark must stay at or below δ, the threshold.",
    csvHeader: ["benchmark", "baseline", "tuned"],
    observed: "the largest baseline − tuned over the named benchmarks",
  },
  parity: {
    label: "Rotary parity probe",
    explains:
      "The conformance probe run in the training environment must read the plan's θ′ and attention factor within float32 tolerance (relative error ≤ 1e-6).",
    csvHeader: null,
    observed: "the worst relative error of the latest probe check on the revision",
  },
};

/** One length bucket of a harness run: what the model was actually fed, in tokens. */
export const provenanceBucketSchema = z.strictObject({
  contextLength: z.number().int().positive(),
  meanTokens: z.number().nonnegative(),
  minTokens: z.number().nonnegative(),
});
export type ProvenanceBucket = z.infer<typeof provenanceBucketSchema>;
