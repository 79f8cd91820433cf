import { isObj } from "../../../shared/json-values";
/**
 * RFC 7396 (JSON Merge Patch), §2 "Processing Merge Patch Documents", in our own words: a patch that is not an object
 * replaces the target; an object patch turns a non-object target into {}, then each member with value null removes
 * that key and every other member is merged recursively. Arrays are replaced whole.
 * Written here because server/engine may import no package (docs/import-walls.md); RFC 7396 Appendix A cases are
 * checked in tests/unit/engine/targets/merge-patch.test.ts.
 */
export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

export function applyMergePatch(target: unknown, patch: unknown): unknown {
  if (!isObj(patch)) return patch;
  const out: Record<string, unknown> = isObj(target) ? { ...target } : {};
  for (const [key, value] of Object.entries(patch)) {
    if (value === null) delete out[key];
    else out[key] = applyMergePatch(out[key], value);
  }
  return out;
}
