import { isObj, type JsonObject } from "../../../../shared/json-values";
import type { TargetArtifact } from "../types";
import { applyMergePatch } from "../merge-patch";
import { parseJsonTyped, pointer, type JsonPath } from "../json-text";

export type Obj = JsonObject;

/**
 * config.json with our merge patch applied, as the library's `from_pretrained` would load it. The patch is read from
 * the artifact's downloaded text (not its object form), so a number written `8` is a Python int and `8.0` a float,
 * exactly as json.load hands them to the library's validators.
 */
export interface ConfigView {
  cfg: Obj;
  /** Python type of the number at `path` in the merged config: "int" or "float" (undefined when not a number) */
  pyType(path: JsonPath): "int" | "float" | undefined;
}

export function loadConfig(config: Obj, artifact: TargetArtifact): ConfigView {
  const { value: patch, intPaths } = parseJsonTyped(artifact.text);
  const cfg = applyMergePatch(config, patch) as Obj;
  const inPatch = (path: JsonPath) => {
    let at: unknown = patch;
    for (const p of path) {
      if (!isObj(at) && !Array.isArray(at)) return false;
      at = (at as Record<string | number, unknown>)[p];
      if (at === undefined) return false;
    }
    return true;
  };
  const valueAt = (path: JsonPath) =>
    path.reduce<unknown>((at, p) => (isObj(at) || Array.isArray(at) ? (at as Obj)[p as string] : undefined), cfg);
  return {
    cfg,
    pyType(path) {
      const v = valueAt(path);
      if (typeof v !== "number") return undefined;
      if (inPatch(path)) return intPaths.has(pointer(path)) ? "int" : "float";
      // Keys the patch leaves alone come from the caller's config object, whose JSON spelling is gone: an
      // integral value is taken as an int, the stricter reading for the float checks below.
      return Number.isInteger(v) ? "int" : "float";
    },
  };
}

/** `int(head_dim * partial_rotary_factor)` as Python truncates it. */
export const rotaryDimension = (headDim: number, partialRotaryFactor: number) =>
  Math.trunc(headDim * partialRotaryFactor);
