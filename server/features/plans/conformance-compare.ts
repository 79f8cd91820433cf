import { runMethod } from "../../engine";
import { FLOAT32_TOLERANCE } from "../../engine/targets/types";
import { rotaryDimension, type MethodParams } from "../../../shared/schemas";
import type { ProbeResult } from "../../../shared/schemas/conformance";
import type { ModelSnapshot } from "./revision-content";

/** The revision's own rotary facts: θ′ and the attention factor of its final block, from its frozen model snapshot. */
export interface RevisionRotary {
  rotaryDim: number;
  targetContext: number;
  method: MethodParams["method"];
  invFreq: number[];
  attentionFactor: number;
}

export function revisionRotary(model: ModelSnapshot, targetContext: number, method: MethodParams): RevisionRotary {
  const d = rotaryDimension(model);
  if (d === null) throw new RangeError("the revision's model has no valid rotary dimension");
  const out = runMethod({ d, base: model.ropeTheta, trainedContext: model.trainedContext, targetContext }, method);
  return {
    rotaryDim: d,
    targetContext,
    method: method.method,
    invFreq: Array.from(out.invFreq),
    attentionFactor: out.attentionFactor,
  };
}

export interface ProbeComparison {
  passed: boolean;
  maxRelativeError: number | null;
  /** the pair with the largest error; null when that is the attention factor, or nothing could be paired */
  worstPair: number | null;
  cause: string;
}

const relative = (read: number, ref: number) => (read === ref ? 0 : Math.abs(read - ref) / Math.abs(ref));

/**
 * Pass when every θ′ and the attention factor the library built agree with the revision's to float32 tolerance
 * (relative 1e-6: float32's unit round-off is 2^−24 ≈ 6e-8, and libraries build θ′ in float32, so a faithful reading
 * lands within a few units of the last place; IEEE 754-2008 binary32). Anything else fails, with the reason in words.
 */
export function compareProbe(rev: RevisionRotary, probe: ProbeResult): ProbeComparison {
  if (probe.rotaryDim !== rev.rotaryDim) {
    return {
      passed: false,
      maxRelativeError: null,
      worstPair: null,
      cause: `the library rotates ${probe.rotaryDim} dimensions; the revision has ${rev.rotaryDim}`,
    };
  }
  let max = relative(probe.attentionFactor, rev.attentionFactor);
  let worstPair: number | null = null;
  rev.invFreq.forEach((ref, i) => {
    const e = relative(probe.invFreq[i], ref);
    if (e > max) [max, worstPair] = [e, i];
  });
  const passed = max <= FLOAT32_TOLERANCE;
  const notes: string[] = [];
  if (!passed) {
    notes.push(
      worstPair === null
        ? `the attention factor is ${probe.attentionFactor}, the revision's ${rev.attentionFactor}`
        : `pair ${worstPair} turns at ${probe.invFreq[worstPair]} rad/token, the revision's at ${rev.invFreq[worstPair]}`,
    );
  }
  // Only dynamic scaling depends on the running length; the revision's θ′ are those at its target length.
  if (rev.method === "dynamic" && probe.runningLength !== rev.targetContext) {
    notes.push(
      `the probe ran at ${probe.runningLength} tokens, the revision's frequencies are for ${rev.targetContext}`,
    );
  }
  // An error beyond float64's range (a reading near 1e308) is reported as unmeasurable, never as Infinity in JSON.
  return { passed, maxRelativeError: Number.isFinite(max) ? max : null, worstPair, cause: notes.join("; ") };
}
