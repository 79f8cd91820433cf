import type { ActivationCheckpointing } from "./schemas/budget";

/** Budget model 1's names that requests and stored plans may still carry, beside their replacements. */
export interface LegacyBudgetNames {
  activationCheckpointing?: ActivationCheckpointing;
  recomputeFraction?: number;
  contextParallel?: number;
  sequenceSharding?: number;
}

/**
 * Budget model 1's names read as their replacements; the new name wins when both are present (the schema refuses
 * both at once anyway, and fractions between 0 and 1). Read by the engine and by the plan's budget sheet, so saving
 * again writes only the new names.
 */
export function currentBudgetNames(b: LegacyBudgetNames): {
  activationCheckpointing: ActivationCheckpointing | undefined;
  contextParallel: number | undefined;
} {
  const legacyMode = b.recomputeFraction === undefined ? undefined : b.recomputeFraction >= 1 ? "full" : "none";
  return {
    activationCheckpointing: b.activationCheckpointing ?? legacyMode,
    contextParallel: b.contextParallel ?? b.sequenceSharding,
  };
}
