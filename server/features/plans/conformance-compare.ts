import { runMethod } from "../../engine";
import { rotateGroups } from "../../engine/group-rotary";
import { FLOAT32_TOLERANCE } from "../../engine/targets/types";
import { rotaryDimension, type MethodParams } from "../../../shared/schemas";
import { groupRotarySpecs } from "../../../shared/layer-groups";
import type { ProbeGroupCheck, ProbeResult } from "../../../shared/schemas/conformance";
import type { ModelSnapshot, RevisionContent } from "./revision-content";
import { runs } from "./report-groups";

/** θ′ and the attention factor one set of layers rotates with. */
interface Rotary {
  rotaryDim: number;
  invFreq: number[];
  attentionFactor: number;
}

/** One rotating layer group of a layered revision, as its fingerprint hashes it (docs/fingerprint.md). */
export interface RevisionGroup extends Rotary {
  kind: string;
  layers: number[];
}

/** The revision's own rotary facts: θ′ and the attention factor of its final block, from its frozen model snapshot. */
export interface RevisionRotary extends Rotary {
  targetContext: number;
  method: MethodParams["method"];
  /** a layered revision's rotating groups, in first-layer order; absent when every layer rotates alike */
  groups?: RevisionGroup[];
}

export function revisionRotary(
  model: ModelSnapshot,
  targetContext: number,
  method: MethodParams,
  groupMethods?: RevisionContent["groupMethods"],
): RevisionRotary {
  const d = rotaryDimension(model);
  if (d === null) throw new RangeError("the revision's model has no valid rotary dimension");
  const out = runMethod({ d, base: model.ropeTheta, trainedContext: model.trainedContext, targetContext }, method);
  // The same groups, methods and order as the revision's fingerprint (revision-content.ts fingerprintContent).
  const specs = groupRotarySpecs(model, method, groupMethods);
  const groups =
    specs && specs.length > 1
      ? rotateGroups(specs, model.trainedContext, targetContext).map((g) => ({
          kind: g.kind,
          layers: g.layers,
          rotaryDim: g.rotaryDim,
          invFreq: g.invFreq,
          attentionFactor: g.attentionFactor,
        }))
      : undefined;
  return {
    rotaryDim: d,
    targetContext,
    method: method.method,
    invFreq: Array.from(out.invFreq),
    attentionFactor: out.attentionFactor,
    ...(groups ? { groups } : {}),
  };
}

export interface ProbeComparison {
  passed: boolean;
  maxRelativeError: number | null;
  /** the pair with the largest error; null when that is the attention factor, or nothing could be paired */
  worstPair: number | null;
  cause: string;
  /** every layer group's own result, in first-layer order; null when every layer rotates alike and was read once */
  groups: ProbeGroupCheck[] | null;
}

/** A comparison, and whether any θ′ was paired at all (a reading of another shape or layout pairs nothing). */
type Outcome = Omit<ProbeComparison, "groups"> & { paired: boolean };

const relative = (read: number, ref: number) => (read === ref ? 0 : Math.abs(read - ref) / Math.abs(ref));

/** One reading against one reference: the largest relative error over the attention factor and every θ′. */
function comparePair(ref: Rotary, read: Rotary): Outcome {
  if (read.rotaryDim !== ref.rotaryDim) {
    return unpaired(`the library rotates ${read.rotaryDim} dimensions; the revision has ${ref.rotaryDim}`);
  }
  let max = relative(read.attentionFactor, ref.attentionFactor);
  let worstPair: number | null = null;
  ref.invFreq.forEach((r, i) => {
    const e = relative(read.invFreq[i], r);
    if (e > max) [max, worstPair] = [e, i];
  });
  const passed = max <= FLOAT32_TOLERANCE;
  const cause = passed
    ? ""
    : worstPair === null
      ? `the attention factor is ${read.attentionFactor}, the revision's ${ref.attentionFactor}`
      : `pair ${worstPair} turns at ${read.invFreq[worstPair]} rad/token, the revision's at ${ref.invFreq[worstPair]}`;
  // An error beyond float64's range (a reading near 1e308) is reported as unmeasurable, never as Infinity in JSON.
  return { passed, maxRelativeError: Number.isFinite(max) ? max : null, worstPair, cause, paired: true };
}

/** A refusal that pairs nothing: the probe's reading does not have the revision's shape or layout. */
function unpaired(cause: string): Outcome {
  return { passed: false, maxRelativeError: null, worstPair: null, cause, paired: false };
}

/**
 * Group by group: every revision group against the probe's reading for the same layers, the worst one reported with
 * its group named (a group that could not be paired wins, the first such in layer order), and each group's own result.
 * `readingOf` gives what the library rotates a group's layers with, or a refusal in words.
 */
function compareGroups(
  refs: readonly RevisionGroup[],
  readingOf: (g: RevisionGroup) => Rotary | string,
): Outcome & { groups: ProbeGroupCheck[] } {
  // each group's result in its own words (a refusal in words when the probe has no reading for it)
  const each = refs.map((g) => {
    const read = readingOf(g);
    return { g, read: typeof read !== "string", own: typeof read === "string" ? unpaired(read) : comparePair(g, read) };
  });
  const groups = each.map(({ g, own: { passed, maxRelativeError, worstPair, cause } }) => {
    return { kind: g.kind, layers: [...g.layers], passed, maxRelativeError, worstPair, cause };
  });
  // the check's own cause names the group it comes from (a refusal already says what is missing)
  const named = ({ g, read, own }: (typeof each)[number]): Outcome =>
    read ? { ...own, cause: own.cause && `the ${g.kind} layers: ${own.cause}` } : own;
  const blocking = each.find((e) => !e.own.passed && (!e.own.paired || e.own.maxRelativeError === null));
  if (blocking) return { ...named(blocking), groups };
  const worst = each.reduce((w, e) => ((e.own.maxRelativeError ?? 0) > (w.own.maxRelativeError ?? 0) ? e : w));
  return { ...named(worst), groups };
}

/**
 * A layered revision against the probe's result. With `layerGroups` (the library builds one rotary per layer type,
 * transformers 5.x nesting rope_parameters) each group is compared with the reading for its own layer type, and the
 * layer types must cover the same layers. Without them the library read one setting: with --layer-type only that
 * type's layers were read, otherwise every layer rotates with the one reading the probe reports.
 */
function compareLayered(refs: readonly RevisionGroup[], probe: ProbeResult): Outcome & { groups: ProbeGroupCheck[] } {
  const groups = probe.layerGroups;
  if (!groups) {
    if (probe.layerType) {
      const others = refs.filter((g) => g.kind !== probe.layerType).map((g) => g.kind);
      const read = compareGroups(refs, (g) =>
        g.kind === probe.layerType ? probe : `not read: the probe ran with --layer-type ${probe.layerType}`,
      );
      return {
        ...unpaired(
          `the probe read only the ${probe.layerType} layers (--layer-type); the revision also rotates the ` +
            `${others.join(" and ")} layers: run it without --layer-type`,
        ),
        groups: read.groups,
      };
    }
    return compareGroups(refs, () => probe);
  }
  const extra = groups.filter((p) => !refs.some((g) => g.kind === p.layerType)).map((p) => p.layerType);
  const byGroup = compareGroups(refs, (g) => {
    const read = groups.find((p) => p.layerType === g.kind);
    if (!read) return `the probe read no ${g.kind} layers (the revision's layers ${runs(g.layers)})`;
    const same = read.layers.length === g.layers.length && read.layers.every((l, i) => l === g.layers[i]);
    if (!same) {
      return `the library's ${g.kind} layers are ${runs(read.layers)}; the revision's are ${runs(g.layers)}`;
    }
    return read;
  });
  if (extra.length) {
    return {
      ...unpaired(`the library rotates ${extra.join(" and ")} layers, which the revision does not`),
      groups: byGroup.groups,
    };
  }
  return byGroup;
}

/**
 * Pass when every θ′ and the attention factor the library built agree with the revision's to float32 tolerance
 * (relative 1e-6: float32's unit round-off is 2^−24 ≈ 6e-8, and libraries build θ′ in float32, so a faithful reading
 * lands within a few units of the last place; IEEE 754-2008 binary32), in every rotating layer group of a layered
 * revision. Anything else fails, with the reason in words.
 */
export function compareProbe(rev: RevisionRotary, probe: ProbeResult): ProbeComparison {
  const { paired, ...result }: Outcome & { groups?: ProbeGroupCheck[] } = rev.groups
    ? compareLayered(rev.groups, probe)
    : probe.layerGroups
      ? // every layer of the revision rotates alike, so each layer type the library read must rotate as it does
        compareGroups(
          probe.layerGroups.map((p) => ({ ...rev, kind: p.layerType, layers: p.layers })),
          (g) => probe.layerGroups!.find((p) => p.layerType === g.kind)!,
        )
      : comparePair(rev, probe);
  const withGroups = { ...result, groups: result.groups ?? null };
  // Only dynamic scaling depends on the running length; the revision's θ′ are those at its target length.
  if (paired && rev.method === "dynamic" && probe.runningLength !== rev.targetContext) {
    const note = `the probe ran at ${probe.runningLength} tokens, the revision's frequencies are for ${rev.targetContext}`;
    return { ...withGroups, cause: result.cause ? `${result.cause}; ${note}` : note };
  }
  return withGroups;
}
