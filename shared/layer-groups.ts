import type { MethodParams } from "./schemas/analysis";
import type { CurrentScaling, LayerGroup } from "./schemas/models";

/*
 * Layer groups as the server, the workbench and the plans read them. A profile without layer types is one
 * full_attention group over every layer, carrying the profile's own base, rotary dimension and scaling.
 */

type GroupSource = {
  layers: number;
  headDim: number;
  partialRotaryFactor: number;
  ropeTheta: number;
  currentScaling?: CurrentScaling | null;
  layerGroups?: LayerGroup[] | null;
};

export const NO_ROPE = "no_rope";
export const FULL_ATTENTION = "full_attention";

export function singleGroup(p: GroupSource): LayerGroup {
  return {
    kind: FULL_ATTENTION,
    layers: Array.from({ length: p.layers }, (_, i) => i),
    ropeTheta: p.ropeTheta,
    rotaryDim: Math.round(p.headDim * p.partialRotaryFactor),
    slidingWindow: null,
    currentScaling: p.currentScaling ?? null,
  };
}

/**
 * The group scaling applies to: the full-attention layers when the model has them, else the first group that
 * rotates. Local-window layers keep their trained frequencies by default (scaling them is a known way to break
 * such models), and no_rope layers have nothing to scale.
 */
export function scaledGroupIndex(groups: readonly LayerGroup[]): number {
  const full = groups.findIndex((g) => g.kind === FULL_ATTENTION);
  if (full >= 0) return full;
  const rotating = groups.findIndex((g) => g.kind !== NO_ROPE && g.rotaryDim > 0);
  return Math.max(0, rotating);
}

/**
 * The profile's groups, with the scaled group following the profile's top-level base, rotary dimension and
 * scaling: those are what the author edits, so they win over a copy stored beside them.
 */
export function layerGroupsOf(p: GroupSource): LayerGroup[] {
  if (!p.layerGroups?.length) return [singleGroup(p)];
  const i = scaledGroupIndex(p.layerGroups);
  const top = singleGroup(p);
  return p.layerGroups.map((g, j) =>
    j === i && g.kind !== NO_ROPE
      ? { ...g, ropeTheta: top.ropeTheta, rotaryDim: top.rotaryDim, currentScaling: top.currentScaling }
      : g,
  );
}

/** One rotating layer group as a plan (or an export request) rotates it. */
export interface GroupRotarySpec {
  kind: string;
  layers: number[];
  rotaryDim: number;
  base: number;
  method: MethodParams;
  /** true for the group the plan's own method applies to */
  scaled: boolean;
}

/**
 * Every rotating group of a layered profile with the method it takes: the scaled group the plan's method, each other
 * group its `groupMethods` entry, else plain RoPE over its own base (as trained). Ordered by each group's first layer,
 * the order the fingerprint hashes them in (docs/fingerprint.md). no_rope layers rotate nothing and are left out.
 * Undefined for a profile with a single group: its one setting is the profile's own.
 */
export function groupRotarySpecs(
  p: GroupSource,
  method: MethodParams,
  groupMethods: readonly { kind: string; method: MethodParams }[] = [],
): GroupRotarySpec[] | undefined {
  if (!p.layerGroups || p.layerGroups.length < 2) return undefined;
  const groups = layerGroupsOf(p);
  const si = scaledGroupIndex(groups);
  return groups
    .map((g, j) => ({ g, j }))
    .filter(({ g }) => g.kind !== NO_ROPE && g.rotaryDim > 0 && g.ropeTheta !== null)
    .map(({ g, j }) => ({
      kind: g.kind,
      layers: g.layers,
      rotaryDim: g.rotaryDim,
      base: g.ropeTheta!,
      method: j === si ? method : (groupMethods.find((m) => m.kind === g.kind)?.method ?? AS_TRAINED),
      scaled: j === si,
    }))
    .sort((a, b) => Math.min(...a.layers) - Math.min(...b.layers));
}

const AS_TRAINED: MethodParams = { method: "default" };
