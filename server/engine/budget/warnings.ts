import type { TrainingMemoryInput } from "./memory";
import type { FitChange, MemoryTerm, TrainingMemory } from "./types";

const gib = (bytes: number) => `${(bytes / 2 ** 30).toFixed(1)} GiB`;

export const MEMORY_TERM_NAMES: Record<MemoryTerm, string> = {
  modelStates: "model states",
  activationCheckpoints: "activation checkpoints",
  recomputeWorkspace: "recompute workspace",
  logits: "logits",
};

/** The settings a fit change alters, in words: "context parallelism 4 and loss chunks 8". */
export function describeChange(
  from: Required<Pick<TrainingMemoryInput, "activationCheckpointing" | "contextParallel" | "lossChunks">>,
  to: FitChange,
): string {
  const parts: string[] = [];
  if (to.activationCheckpointing !== from.activationCheckpointing)
    parts.push(`${to.activationCheckpointing} checkpointing`);
  if (to.contextParallel !== from.contextParallel) parts.push(`context parallelism ${to.contextParallel}`);
  if (to.lossChunks !== from.lossChunks) parts.push(`loss chunks ${to.lossChunks}`);
  return parts.join(" and ");
}

/** "does not fit" in words: the need, the largest term, and the cheapest change that fits (or that none does). */
export function fitWarning(
  memory: TrainingMemory,
  largest: MemoryTerm,
  memoryBytes: number,
  current: Required<
    Pick<TrainingMemoryInput, "activationCheckpointing" | "contextParallel" | "lossChunks" | "accelerators">
  >,
  change: FitChange | null,
): string {
  const head =
    `training needs ${gib(memory.total)} per accelerator, has ${gib(memoryBytes)}; ` +
    `the largest term is the ${MEMORY_TERM_NAMES[largest]} (${gib(memory[largest])})`;
  if (!change)
    return `${head}; no stronger checkpointing, context parallelism or loss chunking on ${current.accelerators} accelerators fits`;
  return `${head}; the cheapest change that fits: ${describeChange(current, change)} (${gib(change.total)})`;
}
