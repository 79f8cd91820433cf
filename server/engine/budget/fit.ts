import { MAX_FIT_LOSS_CHUNKS } from "./defaults";
import { trainingMemoryPerAccelerator, type TrainingMemoryInput } from "./memory";
import { ACTIVATION_CHECKPOINTING } from "../../../shared/schemas/budget";
import type { FitChange } from "./types";

/** `from`, 2·from, 4·from … up to `max`. */
function doublings(from: number, max: number): number[] {
  const out: number[] = [];
  for (let v = from; v <= max; v *= 2) out.push(v);
  return out;
}

type Resolved = Required<Omit<TrainingMemoryInput, "model" | "sequenceLength" | "accelerators">> &
  Pick<TrainingMemoryInput, "model" | "sequenceLength" | "accelerators">;

/**
 * The cheapest settings that fit (docs/budget-conventions.md "fit"), or null when none does. Cheapness is ordered:
 * keep the checkpointing mode if at all possible (a stronger one costs compute: selective re-runs attention, full a
 * whole forward pass); then the smallest context-parallel degree (it costs communication and data-parallel ranks);
 * then the fewest loss chunks (nearly free). Degrees and chunks grow by doubling from the current values; a degree
 * must keep the sequence divisible by 2 × degree and not exceed the accelerators.
 */
export function cheapestFit(input: Resolved, memoryBytes: number): FitChange | null {
  // The shared tuple is ordered weakest to strongest, so the modes from the current one on are the acceptable ones.
  const modes = ACTIVATION_CHECKPOINTING.slice(ACTIVATION_CHECKPOINTING.indexOf(input.activationCheckpointing));
  const degrees = doublings(input.contextParallel, input.accelerators).filter(
    (cp) => cp === 1 || input.sequenceLength % (2 * cp) === 0,
  );
  const chunks = doublings(input.lossChunks, Math.max(input.lossChunks, MAX_FIT_LOSS_CHUNKS));
  for (const activationCheckpointing of modes) {
    for (const contextParallel of degrees) {
      for (const lossChunks of chunks) {
        const memory = trainingMemoryPerAccelerator({ ...input, activationCheckpointing, contextParallel, lossChunks });
        if (memory.total <= memoryBytes)
          return { activationCheckpointing, contextParallel, lossChunks, total: memory.total };
      }
    }
  }
  return null;
}
