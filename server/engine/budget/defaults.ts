/**
 * Defaults applied when an input is left out. The engine owns them (shared/ has no defaults), so the
 * response's assumptions always report the value that was actually used.
 */
export const BUDGET_DEFAULTS = {
  /** Model FLOPs utilisation. An assumption: common practice, no source. */
  utilization: 0.4,
  convention: "causal",
  /**
   * Full checkpointing: the one mode whose activations stay linear in the sequence length, and the memory model
   * budget model 1 assumed (one checkpoint per layer), so an old request keeps the memory picture it had.
   */
  activationCheckpointing: "full",
  /** Fused attention kernels are the norm for long-context training: common practice, no source. */
  flashAttention: true,
  contextParallel: 1,
  lossChunks: 1,
  /** bf16 weights + bf16 grads + fp32 master weights + fp32 Adam m and v = 2+2+4+4+4. Common practice, no source. */
  optimizerBytesPerParameter: 16,
  bytesPerElement: 2,
  microBatchSequences: 1,
  growthPoints: 9,
} as const;

/** The growth curve runs from the trained length to this multiple of the target. */
export const GROWTH_REACH = 4;

/** The fit search tries loss chunks up to this many (powers of two). */
export const MAX_FIT_LOSS_CHUNKS = 1024;

export const BILLION = 1e9;
