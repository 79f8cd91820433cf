import type { TargetId } from "./types";

export type * from "./types";
export { TARGET_IDS, EXACT_TOLERANCE, FLOAT32_TOLERANCE } from "./types";
export { conformance, type Conformance } from "./conformance";
export { applyMergePatch } from "./merge-patch";
export { floatText, parseJsonTyped, writeJsonText } from "./json-text";
export {
  TARGETS,
  SECTIONS_WITH_ARTIFACT,
  exportForTargets,
  runningLength,
  targetsKeepingSections,
  type TargetExport,
} from "./registry";

export { configOfShape, exportPlan, planRotary, stacksKeepingSections, type PlanExport } from "./export-plan";

/** The shared schema's id list and the engine's must name the same targets (a type error otherwise). */
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const sameIds: Same<(typeof import("../../../shared/schemas/exports").EXPORT_TARGET_IDS)[number], TargetId> = true;
void sameIds;
