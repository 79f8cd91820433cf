import crypto from "node:crypto";
import canonicalize from "canonicalize";
import { analyse, ENGINE_VERSION } from "../../engine";
import { planFingerprint } from "../../engine/fingerprint";
import { invalidFields } from "../../platform/validate";
import { pathOfKey } from "../../../shared/validation-messages";
import {
  modelDependentIssues,
  type MethodParams,
  type RevisionValues,
  type StageResult,
  type Bands,
  type ModelShape,
  type LayerGroup,
  type CurrentScaling,
} from "../../../shared/schemas";
import type { ModelRow } from "../models";
import type { ModelSnapshot, RevisionContent } from "../../../shared/schemas/plans";
import { rotaryShapeOf } from "../../../shared/profile-shapes";
import { groupRotarySpecs } from "../../../shared/layer-groups";
import { groupMethodIssues, groupResults } from "./group-results";
import { lineageIssues } from "./lineage-rules";
import { engineMethod, servedContextOf, shippedMethod } from "../../../shared/lineage";

/**
 * The profile values a revision freezes (later edits of the profile do not change a revision) and the content itself:
 * both contracts live in shared/schemas/plans/responses.ts.
 */
export type { ModelSnapshot, RevisionContent };

export const snapshotOf = (m: ModelRow): ModelSnapshot => ({
  id: m.id,
  name: m.name,
  family: m.family,
  headDim: m.headDim,
  partialRotaryFactor: m.partialRotaryFactor,
  ropeTheta: m.ropeTheta,
  trainedContext: m.trainedContext,
  layers: m.layers,
  attentionHeads: m.attentionHeads,
  kvHeads: m.kvHeads,
  hiddenSize: m.hiddenSize,
  parameters: m.parameters,
  parametersTotal: m.parametersTotal,
  bytesPerElement: m.bytesPerElement,
  // Only layered models carry their groups, so a single-group snapshot (and its content hash) is as before.
  ...(Array.isArray(m.layerGroups) && m.layerGroups.length > 1 ? { layerGroups: m.layerGroups as LayerGroup[] } : {}),
  // Likewise only a model that ships scaling carries its lineage.
  ...(m.currentScaling
    ? {
        lineage: {
          servedContext: servedContextOf(m),
          shipped: shippedMethod(m.currentScaling as CurrentScaling),
        },
      }
    : {}),
  // Likewise only a model with multimodal sections carries them, so a plan can say which axis each section rotates.
  ...(Array.isArray(m.mropeSection) && m.mropeSection.length
    ? { mropeSection: m.mropeSection as number[], mropeInterleaved: m.mropeInterleaved }
    : {}),
});

/** Model-dependent rules for the plan target and every stage, reported on the field to fix. */
export function checkAgainstModel(model: ModelSnapshot, v: RevisionValues) {
  const fields: Record<string, string> = {};
  const shape = rotaryShapeOf(model);
  const add = (prefix: string, target: number, method: MethodParams) => {
    for (const issue of modelDependentIssues(shape, target, [method])) {
      const path = issue.path[0] === "methods" ? ["method", ...issue.path.slice(2)] : issue.path;
      fields[[prefix, ...path].filter((p) => p !== "").join(".")] = issue.message.replace(/ \(methods\.0\)/, "");
    }
  };
  add("", v.targetContext, engineMethod({ model, extendsFrom: v.extendsFrom }, v.method));
  v.stages.forEach((s, i) =>
    add(`stages.${i}`, s.targetContext, engineMethod({ model, extendsFrom: v.extendsFrom }, s.method)),
  );
  Object.assign(fields, lineageIssues(model, v));
  Object.assign(fields, groupMethodIssues(model, v));
  v.acceptance.forEach((a, i) => {
    if (a.contextLength > v.targetContext)
      fields[`acceptance.${i}.contextLength`] = `beyond the plan's target (${v.targetContext})`;
  });
  if (Object.keys(fields).length)
    throw invalidFields(Object.entries(fields).map(([k, m]) => ({ path: pathOfKey(k), message: m })));
}

/** The engine's result for one rotary shape, target and method, in the stored form. */
export function stageResult(shape: ModelShape, target: number, method: MethodParams, bands?: Bands) {
  const a = analyse({ model: shape, targetContext: target, methods: [method], bands });
  const m = a.methods[0];
  const idx = (f: "unseenAngles" | "compressedResolution" | "exceedsTrainedWindow") =>
    m.pairs.filter((p) => p[f]).map((p) => p.index);
  const result: StageResult = {
    targetContext: target,
    method: m.method,
    params: m.params as Record<string, unknown>,
    attentionFactor: m.attentionFactor,
    summary: m.summary,
    flags: {
      unseenAngles: idx("unseenAngles"),
      compressedResolution: idx("compressedResolution"),
      exceedsTrainedWindow: idx("exceedsTrainedWindow"),
    },
    bands: m.pairs.map((p) => p.band),
    scaledWavelengths: m.pairs.map((p) => p.scaledWavelength),
    patch: m.ropeScaling,
  };
  return { analysis: a, result };
}

/**
 * Runs the engine for the plan target and each stage; the results are frozen into the content. The content keeps the
 * methods as the author gave them; the engine runs them as consumers read them (engineMethod: a plan that extends
 * from the served length has its factors carried over to the pre-trained length).
 */
export function buildContent(model: ModelSnapshot, values: RevisionValues): RevisionContent {
  checkAgainstModel(model, values);
  const chained = (m: MethodParams) => engineMethod({ model, extendsFrom: values.extendsFrom }, m);
  const v = {
    ...values,
    method: chained(values.method),
    stages: values.stages.map((s) => ({ ...s, method: chained(s.method) })),
  };
  const final = stageResult(rotaryShapeOf(model), v.targetContext, v.method, v.bands);
  const groups = groupResults(model, v, final.result, stageResult);
  const { budget: _inputs, ...rest } = values;
  return {
    ...rest,
    engineVersion: ENGINE_VERSION,
    model,
    results: {
      rotaryDim: final.analysis.model.rotaryDim,
      criticalDimension: final.analysis.criticalDimension,
      criticalBase: final.analysis.criticalBase,
      baseSupport: {
        supportedLength: final.analysis.baseSupport.supportedLength,
        checkedUpTo: final.analysis.baseSupport.checkedUpTo,
        complete: final.analysis.baseSupport.complete,
      },
      final: final.result,
      stages: v.stages.map((s) => stageResult(rotaryShapeOf(model), s.targetContext, s.method, v.bands).result),
      ...(groups ? { groups } : {}),
    },
  };
}

/** SHA-256 over the RFC 8785 canonical JSON of the content. */
export function hashContent(content: unknown): string {
  const canonical = canonicalize(content);
  if (canonical === undefined) throw new Error("content cannot be canonicalised");
  return crypto.createHash("sha256").update(canonical, "utf8").digest("hex");
}

/**
 * The revision's rotary fingerprint (docs/fingerprint.md), from its frozen model snapshot and final block, over every
 * rotating layer group of a layered model (a single-group snapshot hashes as it always did). Stored in
 * its own column, outside the hashed content, so revisions made before fingerprints existed keep their content hash.
 */
export const fingerprintContent = (content: RevisionContent) => {
  const method = engineMethod(content, content.method);
  return planFingerprint(
    rotaryShapeOf(content.model),
    content.targetContext,
    method,
    groupRotarySpecs(content.model, method, content.groupMethods),
  );
};

/** The stored fingerprint, or for a row written before the column existed and not yet backfilled, computed now. */
export const fingerprintOfRow = (row: { rotaryFingerprint: string | null; content: unknown }) =>
  row.rotaryFingerprint ?? fingerprintContent(row.content as RevisionContent);
