import {
  modelDependentIssues,
  type MethodParams,
  type RevisionValues,
  type StageResult,
} from "../../../shared/schemas";
import type { GroupResult, ModelSnapshot } from "../../../shared/schemas/plans";
import type { LayerGroup } from "../../../shared/schemas";
import { NO_ROPE, scaledGroupIndex } from "../../../shared/layer-groups";
import { groupShape, rotaryShapeOf, sectionsOf } from "../../../shared/profile-shapes";
import { patchWithBase } from "../../engine/methods/common";
// A cycle-free import: revision-content.ts imports this file only for the two functions below, and stageResult is
// passed in rather than imported back.
type StageFn = (
  shape: ReturnType<typeof rotaryShapeOf>,
  target: number,
  method: MethodParams,
  bands?: RevisionValues["bands"],
) => { result: StageResult };

/*
 * A plan on a layered model (issue 11): the scaled group (full attention) takes the plan's method and stages; every
 * other group takes its entry in `groupMethods`, else stays as trained (no rescaling). Local-window layers with
 * their own base are the reason: scaling them is a known way to break such models.
 */

const AS_TRAINED: MethodParams = { method: "default" };

/**
 * How far the group's layers attend: a sliding window masks keys farther than the window, so as trained those layers
 * never see a distance beyond min(target, window). A method that extends the context is checked at the target.
 */
const checkedDistance = (g: LayerGroup, target: number, m: MethodParams) =>
  g.slidingWindow && m.method === "default" ? Math.min(target, g.slidingWindow) : target;

/** Field-named problems with `groupMethods`, for checkAgainstModel. */
export function groupMethodIssues(model: ModelSnapshot, v: RevisionValues): Record<string, string> {
  const fields: Record<string, string> = {};
  const groups = model.layerGroups ?? [];
  const scaled = groups.length ? groups[scaledGroupIndex(groups)].kind : "full_attention";
  const seen = new Set<string>();
  (v.groupMethods ?? []).forEach((gm, i) => {
    const at = `groupMethods.${i}`;
    const g = groups.find((x) => x.kind === gm.kind);
    if (!g) {
      const kinds = groups.length ? groups.map((x) => x.kind).join(", ") : `one group (${scaled})`;
      fields[`${at}.kind`] = `the model has no ${gm.kind} layers (it has ${kinds})`;
    } else if (seen.has(gm.kind)) fields[`${at}.kind`] = `${gm.kind} is listed twice`;
    else if (gm.kind === scaled) fields[`${at}.kind`] = `the ${scaled} layers take the plan's own method; set it there`;
    else if (g.kind === NO_ROPE) fields[`${at}.kind`] = "no_rope layers have no rotary positions to rescale";
    else {
      for (const issue of modelDependentIssues(groupShape(model, g), checkedDistance(g, v.targetContext, gm.method), [
        gm.method,
      ])) {
        const path = issue.path[0] === "methods" ? ["method", ...issue.path.slice(2)] : issue.path;
        fields[[at, ...path].join(".")] = issue.message.replace(/ \(methods\.0\)/, "");
      }
    }
    seen.add(gm.kind);
  });
  return fields;
}

/**
 * A group without rotary positions: nothing to scale. Its block is still a patch of the model's one config.json, so
 * for a model with multimodal sections it holds them as every other group's block does (patchWithBase), instead of a
 * null rope_scaling that would delete the sections the rotating layers read.
 */
const unrotated = (model: ModelSnapshot, g: LayerGroup, target: number): GroupResult => ({
  kind: g.kind,
  layers: g.layers,
  ropeTheta: null,
  rotaryDim: 0,
  slidingWindow: g.slidingWindow,
  checkedUpTo: target,
  scaled: false,
  targetContext: target,
  method: "none",
  params: {},
  attentionFactor: 1,
  summary: { unseenAnglesPairs: 0, compressedResolutionPairs: 0, exceedsTrainedWindowPairs: 0 },
  flags: { unseenAngles: [], compressedResolution: [], exceedsTrainedWindow: [] },
  bands: [],
  scaledWavelengths: [],
  patch: patchWithBase({ targetContext: target, ...sectionsOf(model) }, null),
});

/** Every group's frozen result; undefined for a single-group model (its result is `final`). */
export function groupResults(
  model: ModelSnapshot,
  v: RevisionValues,
  final: StageResult,
  stage: StageFn,
): GroupResult[] | undefined {
  const groups = model.layerGroups;
  if (!groups || groups.length < 2) return undefined;
  const si = scaledGroupIndex(groups);
  return groups.map((g, j): GroupResult => {
    const head = { kind: g.kind, layers: g.layers, ropeTheta: g.ropeTheta, rotaryDim: g.rotaryDim };
    if (g.kind === NO_ROPE || g.rotaryDim === 0) return unrotated(model, g, v.targetContext);
    if (j === si)
      return { ...final, ...head, slidingWindow: g.slidingWindow, checkedUpTo: v.targetContext, scaled: true };
    const method = v.groupMethods?.find((gm) => gm.kind === g.kind)?.method ?? AS_TRAINED;
    const distance = checkedDistance(g, v.targetContext, method);
    const { result } = stage(groupShape(model, g), distance, method, v.bands);
    return { ...result, ...head, slidingWindow: g.slidingWindow, checkedUpTo: distance, scaled: false };
  });
}
