import type { MethodParams } from "../../../shared/schemas/analysis";
import type { GroupRotary } from "../group-rotary";

/**
 * Export targets (issue 10): each consumer stack is data plus a reader. The reader is a pure function that computes
 * what that consumer will use from a config (with our artifact applied) or from launch arguments. Every rule in a
 * reader cites the consumer's repository, path and version or pull request beside it (docs/export-targets.md).
 */
export const TARGET_IDS = [
  "transformers-v4-early",
  "transformers-v4",
  "transformers-v5",
  "vllm",
  "sglang",
  "llama-cpp",
] as const;
export type TargetId = (typeof TARGET_IDS)[number];

/** `config-merge-patch`: an RFC 7396 merge patch for config.json; `launch-args`: `{ args: [...], … }` for an engine. */
export type ArtifactKind = "config-merge-patch" | "launch-args";

export interface TargetArtifact {
  kind: ArtifactKind;
  /** the merge patch, or `{ args: string[], … }` (launch targets may add e.g. `metadata` for GGUF keys) */
  content: Record<string, unknown>;
  /** the exact bytes a user downloads (floats the consumer types as floats keep a decimal point: `8.0`) */
  text: string;
}

/** What a consumer computes: the facts the conformance check compares with the plan. */
export interface ConsumerReading {
  rotaryDim: number;
  base: number;
  /** the length the consumer treats as the original (pre-extension) context, or null when it reads none */
  originalLength: number | null;
  /** the consumer's own name for the rotary code path it takes (e.g. "yarn", "linear", "default") */
  method: string;
  invFreq: number[];
  attentionFactor: number;
  /** what the consumer's own validation would warn about or reject; empty means it accepts the artifact silently */
  warnings: string[];
  /**
   * Layered configs (issue 11, additive): every layer type's own reading. The fields above are the scaled
   * (full-attention) layers', which the plan is compared with.
   */
  layerGroups?: { layerType: string; base: number; method: string; invFreq: number[]; attentionFactor: number }[];
}

/** What the plan means, as our engine computes it: the reference a reading is compared with. */
export interface PlanRotary {
  rotaryDim: number;
  base: number;
  trainedContext: number;
  targetContext: number;
  invFreq: number[];
  attentionFactor: number;
  /**
   * A layered model (issue 11): every rotating layer group with its own base, rotary dimension, method, θ′ and
   * attention factor, in first-layer order; the fields above are the scaled group's. Absent for a single-group model.
   */
  groups?: GroupRotary[];
}

/** The plan plus what the compilers need of the engine's one run of its method for this export. */
export interface PlanRun extends PlanRotary {
  /** the method's parameters with every default filled in (a compiler writes these, never a default of its own) */
  params: MethodParams;
  /** the base the result corresponds to when the method only changes the base, else null */
  effectiveBase: number | null;
}

export interface CompileInput {
  /** the model's config.json as imported, or one synthesised from the profile (keys of the open config format) */
  config: Record<string, unknown>;
  /** the plan's method with its parameters (shared/methods catalog schema) */
  method: MethodParams;
  plan: PlanRun;
}

/** A target either expresses the plan or says why not and what comes closest. */
export type CompileResult =
  { ok: true; artifact: TargetArtifact } | { ok: false; cause: string; workaround: string; artifact?: TargetArtifact };

export interface ExportTarget {
  id: TargetId;
  label: string;
  consumer: string;
  /** the consumer versions this reader follows, e.g. ["4.45.0", "4.46.x"] */
  versions: string[];
  artifactKind: ArtifactKind;
  compile(input: CompileInput): CompileResult;
  /**
   * The consumer's reading: `config` is the model's config.json; the reader applies `artifact` the way the consumer
   * would (merge patch into config.json, or launch arguments on top of it). `runningLength` matters only to methods
   * whose frequencies depend on the current sequence length (dynamic scaling).
   */
  read(config: Record<string, unknown>, artifact: TargetArtifact, runningLength?: number): ConsumerReading;
}

/** Conformance status: `exact` ≤ 1e-12 relative, `equivalent` ≤ 1e-6 (float32-indistinguishable), else `differs`. */
export type ConformanceStatus = "exact" | "equivalent" | "differs" | "unsupported";
export const EXACT_TOLERANCE = 1e-12;
export const FLOAT32_TOLERANCE = 1e-6;

/** One layer group's comparison, listed under a target's conformance for a layered plan. */
export interface GroupConformance {
  kind: string;
  status: ConformanceStatus;
  maxRelativeError: number | null;
  worstPair: number | null;
  cause: string;
}
