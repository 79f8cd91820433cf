import type { AppDeps } from "../../deps";
import { Invalid, NotFound } from "../../platform/errors";
import { invalidFields } from "../../platform/validate";
import { exportPlan, TARGETS, TARGET_IDS } from "../../engine/targets";
import { modelDependentIssues, rotaryShapeSchema, type ModelShape } from "../../../shared/schemas/analysis";
import type { ExportRequest, ExportResponse } from "../../../shared/schemas/exports";
import { findModelRow, sourceConfigOf, type ModelRow } from "../models";
import { chainedMethod, lineageOf, servedContextOf, type Lineage } from "../../../shared/lineage";
import { rotaryShapeOf } from "../../../shared/profile-shapes";
import { groupRotarySpecs } from "../../../shared/layer-groups";
import type { MethodParams } from "../../../shared/schemas/analysis";
import type { CurrentScaling, LayerGroup } from "../../../shared/schemas/models";
import type { GroupMethod } from "../../../shared/schemas/plans";

/** The target list: id, label, consumer, the versions its reader follows and the kind of artifact. */
export const listTargets = () => ({
  targets: TARGET_IDS.map((id) => {
    const t = TARGETS[id];
    return { id, label: t.label, consumer: t.consumer, versions: t.versions, artifactKind: t.artifactKind };
  }),
});

async function resolveModel(deps: AppDeps, input: ExportRequest["model"], inline?: LayerGroup[]) {
  if (!("modelId" in input)) {
    const source = { ...input, layers: input.layers ?? 0, partialRotaryFactor: input.partialRotaryFactor ?? 1 };
    return {
      model: input,
      groups: (m: MethodParams, gm?: GroupMethod[]) => groupRotarySpecs({ ...source, layerGroups: inline }, m, gm),
      lineage: null,
    };
  }
  const row = await findModelRow(deps.db, input.modelId);
  if (!row) throw new NotFound("no such model profile");
  const parsed = rotaryShapeSchema.safeParse(rotaryShapeOf(row));
  if (!parsed.success) {
    const { fields } = invalidFields(
      parsed.error.issues.map((i) => ({ path: ["model", ...i.path], message: i.message })),
    );
    throw new Invalid("The stored model profile cannot be exported.", fields);
  }
  // A layered profile: every rotating group is exported and compared, the others as trained (the plan default).
  const layerGroups = Array.isArray(row.layerGroups) ? (row.layerGroups as LayerGroup[]) : null;
  const groups = (method: MethodParams, gm?: GroupMethod[]) =>
    groupRotarySpecs({ ...row, currentScaling: row.currentScaling as CurrentScaling | null, layerGroups }, method, gm);
  return { model: parsed.data, config: sourceConfigOf(row), groups, lineage: lineageOf(snapshotLineageOf(row)) };
}

/** The saved profile's lengths as a revision would freeze them (lineage only for a model that ships scaling). */
const snapshotLineageOf = (row: ModelRow) => ({
  trainedContext: row.trainedContext,
  ...(row.currentScaling
    ? {
        lineage: { servedContext: servedContextOf(row), shipped: null },
      }
    : {}),
});

/** The method as consumers read it: a stretch of the served length becomes one over the pre-trained length. */
function methodFor(input: ExportRequest, lineage: Lineage | null) {
  if (input.extendsFrom !== "served") return input.method;
  if (!lineage)
    throw new Invalid("Only a saved profile that ships scaling has a served length to extend from.", {
      extendsFrom: "needs a saved profile (model.modelId) whose config ships scaling",
    });
  return chainedMethod(input.method, lineage, "served");
}

/**
 * An inline shape's multimodal sections, in the block a config.json carries them in (the 4.x `rope_scaling`), so the
 * patches keep them as they do over an imported file (server/engine/targets/hf/compile.ts says why they must).
 */
function sectionsConfig(input: ExportRequest): Record<string, unknown> | undefined {
  if (!input.mropeSection) return undefined;
  const block = { rope_type: "default", mrope_section: input.mropeSection };
  return { rope_scaling: input.mropeInterleaved ? { ...block, mrope_interleaved: true } : block };
}

/**
 * POST /api/exports: compiles the plan for each requested target (all when none are named) and reads each artifact
 * back. A stateless computation: nothing is stored, so nothing is audited.
 */
export async function exportRequest(deps: AppDeps, input: ExportRequest): Promise<ExportResponse> {
  const { model, config, groups, lineage } = await resolveModel(deps, input.model, input.layerGroups);
  const method = methodFor(input, lineage);
  refuseMisfits(model, { ...input, method });
  return exportPlan({
    model,
    config: config ?? sectionsConfig(input),
    targetContext: input.targetContext,
    method,
    targets: input.targets,
    groups: groups(method, input.groupMethods),
  });
}

/** The analysis rules that need the model (rotary dim, factor lists sized to the pairs …), named on the export's fields. */
function refuseMisfits(model: ModelShape, input: ExportRequest) {
  const issues = modelDependentIssues(model, input.targetContext, [input.method]);
  if (!issues.length) return;
  throw invalidFields(
    issues.map((i) => ({
      path: i.path[0] === "methods" ? ["method", ...i.path.slice(2)] : i.path,
      message: i.message,
    })),
  );
}
