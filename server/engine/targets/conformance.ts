import type { CompileResult, ConformanceStatus, ConsumerReading, GroupConformance, PlanRotary } from "./types";
import { EXACT_TOLERANCE, FLOAT32_TOLERANCE } from "./types";

export interface Conformance {
  status: ConformanceStatus;
  /** the largest |read − plan| / |plan| over every θ′ and the attention factor; null when they cannot be paired */
  maxRelativeError: number | null;
  /** the pair index where that error occurs; null when it is the attention factor or nothing could be paired */
  worstPair: number | null;
  cause: string;
  workaround: string;
  /** a layered plan's comparison per rotating layer group (group-conformance.ts) */
  groups?: GroupConformance[];
}

const relative = (read: number, plan: number) =>
  read === plan ? 0 : plan === 0 ? Infinity : Math.abs(read - plan) / Math.abs(plan);

/**
 * Compares what a consumer reads with what the plan means. The status is earned only from the read-back numbers:
 * `exact` ≤ 1e-12 relative on every θ′ and on the attention factor, `equivalent` ≤ 1e-6 (float32 cannot tell them
 * apart: its unit round-off is 2^−24 ≈ 6e-8), else `differs`. A target that cannot express the plan is `unsupported`
 * whatever its fallback artifact reads as.
 */
export function conformance(plan: PlanRotary, reading: ConsumerReading | null, compiled?: CompileResult): Conformance {
  if (compiled && !compiled.ok) {
    return { status: "unsupported", maxRelativeError: null, worstPair: null, ...causeOf(compiled) };
  }
  if (!reading) {
    return { status: "unsupported", maxRelativeError: null, worstPair: null, cause: "no reading", workaround: "" };
  }
  const warnings = reading.warnings.length ? ` The consumer warns: ${reading.warnings.join("; ")}.` : "";
  if (reading.rotaryDim !== plan.rotaryDim || reading.invFreq.length !== plan.invFreq.length) {
    return {
      status: "differs",
      maxRelativeError: null,
      worstPair: null,
      cause: `it rotates ${reading.rotaryDim} dimensions (${reading.invFreq.length} pairs); the plan has ${plan.rotaryDim}.${warnings}`,
      workaround: "",
    };
  }
  let max = relative(reading.attentionFactor, plan.attentionFactor);
  let worstPair: number | null = null;
  plan.invFreq.forEach((p, i) => {
    const e = relative(reading.invFreq[i], p);
    if (e > max || Number.isNaN(e)) [max, worstPair] = [e, i];
  });
  const status: ConformanceStatus =
    max <= EXACT_TOLERANCE ? "exact" : max <= FLOAT32_TOLERANCE ? "equivalent" : "differs";
  const finite = Number.isFinite(max) ? max : null;
  if (status !== "differs") {
    return { status, maxRelativeError: finite, worstPair, cause: warnings.trim(), workaround: "" };
  }
  return { status, maxRelativeError: finite, worstPair, cause: differences(plan, reading) + warnings, workaround: "" };
}

function causeOf(c: Extract<CompileResult, { ok: false }>) {
  return { cause: c.cause, workaround: c.workaround };
}

/** Plain words for what the consumer reads differently (the first facts that disagree). */
function differences(plan: PlanRotary, r: ConsumerReading): string {
  const out: string[] = [];
  if (relative(r.base, plan.base) > EXACT_TOLERANCE) out.push(`it uses base ${r.base}, the plan ${plan.base}`);
  if (r.originalLength !== null && r.originalLength !== plan.trainedContext) {
    out.push(`it treats ${r.originalLength} as the original length, the plan ${plan.trainedContext}`);
  }
  if (relative(r.attentionFactor, plan.attentionFactor) > FLOAT32_TOLERANCE) {
    out.push(`its attention factor is ${r.attentionFactor}, the plan's ${plan.attentionFactor}`);
  }
  if (out.length === 0) out.push(`its ${r.method} frequencies differ from the plan's`);
  return out.join("; ") + ".";
}
