import type { z } from "zod";
import type { budgetConventionSchema } from "../../../shared/schemas/budget";
import { GROWTH_REACH } from "./defaults";

export type BudgetConvention = z.output<typeof budgetConventionSchema>;

/**
 * Every convention a budget sheet rests on, stated once, in the words docs/budget-conventions.md explains.
 * Figures link to these by id; the sheet prints each once. Sources are named as we recall them (from memory).
 */
export const BUDGET_CONVENTIONS: readonly BudgetConvention[] = [
  {
    id: "tokens",
    title: "Tokens",
    statement:
      "Tokens per stage = steps × global batch × sequence length; a token target is met with whole steps, steps = ceil(tokens ÷ (global batch × length)).",
    basis: "stated",
    source: null,
  },
  {
    id: "flops",
    title: "Training FLOPs per token",
    statement:
      "6N + an attention term (causal: 6·layers·length·heads·head dim; full: twice that). N is the parameter count given; Kaplan et al. count non-embedding parameters, so a total count overstates 6N slightly.",
    basis: "published",
    source: "Kaplan et al. 2020, Eq. 2.2 and Table 1 (causal); Chowdhery et al. 2022, App. B (full)",
  },
  {
    id: "checkpointing-flops",
    title: "Recompute FLOPs",
    statement:
      "The forward pass is one third of the training figure. Full checkpointing re-runs it: FLOPs × 4/3. Selective checkpointing re-runs the attention core: + attention term ÷ 3. None re-runs nothing.",
    basis: "published",
    source: "Korthikanti et al. 2022, Sec. 5 (selective recomputation)",
  },
  {
    id: "utilisation",
    title: "Accelerator-hours",
    statement:
      "Accelerator-hours = FLOPs ÷ (peak FLOP/s × utilisation × 3600); wall clock = accelerator-hours ÷ accelerators. Utilisation is assumed (0.4 when not given: common practice, no source) or derived from a measured throughput: tokens/s per accelerator × FLOPs per token at the measured length ÷ peak.",
    basis: "stated",
    source: null,
  },
  {
    id: "cost",
    title: "Cost",
    statement: "Cost = accelerator-hours × price per accelerator-hour, in the workspace currency.",
    basis: "stated",
    source: null,
  },
  {
    id: "model-states",
    title: "Model states",
    statement:
      "Parameters × optimizer bytes per parameter (16 by default: bf16 weights and gradients, fp32 master weights and Adam moments) ÷ data-parallel ranks, ranks = floor(accelerators ÷ context parallelism).",
    basis: "common practice",
    source: null,
  },
  {
    id: "activations",
    title: "Activation checkpoints and recompute workspace",
    statement:
      "Per layer with every activation kept, at 16-bit activations: s·b·h·(34 + 5·a·s/h) bytes, the 5·a·s/h part (attention scores) dropped with flash attention. Kept for backward: none → all layers; selective → 34·s·b·h per layer; full → 2·s·b·h per layer (the layer inputs) plus one layer rebuilt at a time. s = sequence ÷ context parallelism. Scaled by bytes per element ÷ 2.",
    basis: "published",
    source: 'Korthikanti et al. 2022, "Reducing Activation Recomputation in Large Transformer Models", Table 2 (t = 1)',
  },
  {
    id: "logits",
    title: "Logits",
    statement:
      "s·b·V values in fp32 (4 bytes), divided by the loss chunks; s = sequence ÷ context parallelism. Not counted when the vocabulary is unknown.",
    basis: "stated",
    source: null,
  },
  {
    id: "context-parallel",
    title: "Context parallelism",
    statement:
      "Each sequence is split over the degree, ring-attention style; the length must divide by 2 × degree, because each rank takes one early and one late chunk of 2 × degree equal chunks so causal work is balanced.",
    basis: "stated",
    source: null,
  },
  {
    id: "fit",
    title: "Fit and the cheapest change",
    statement:
      "Fits when modelStates + activation checkpoints + recompute workspace + logits ≤ accelerator memory (buffers and fragmentation not counted). Cheapest change: keep the checkpointing mode if possible, then the smallest context-parallel degree, then the fewest loss chunks, each doubled from the current value.",
    basis: "stated",
    source: null,
  },
  {
    id: "kv-cache",
    title: "KV cache",
    statement:
      "Bytes per sequence = Σ over layer groups of 2 · KV heads · head dim · bytes · layers · tokens held; full-attention layers hold the sequence, local-window layers at most their window. Latent attention caches kvLatentDim elements per token per layer, no factor 2. Bytes per element: the cache's, default the model's.",
    basis: "stated",
    source: null,
  },
  {
    id: "serving",
    title: "Serving",
    statement: `One whole copy of the weights per accelerator; the rest holds KV cache of whole sequences (activations and fragmentation not counted). The growth curve runs from the trained length to ${GROWTH_REACH} × the target.`,
    basis: "stated",
    source: null,
  },
];
