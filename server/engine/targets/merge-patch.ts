/**
 * RFC 7396 (JSON Merge Patch), §2 "Processing Merge Patch Documents", in our own words: a patch that is not an object
 * replaces the target; an object patch turns a non-object target into {}, then each member with value null removes
 * that key and every other member is merged recursively. Arrays are replaced whole.
 * Written here because server/engine may import no package (docs/import-walls.md); RFC 7396 Appendix A cases are
 * checked in tests/unit/engine/targets/merge-patch.test.ts.
 */
export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

export function applyMergePatch(target: unknown, patch: unknown): unknown {
  if (!isObject(patch)) return patch;
  const out: Record<string, unknown> = isObject(target) ? { ...target } : {};
  for (const [key, value] of Object.entries(patch)) {
    if (value === null) delete out[key];
    else out[key] = applyMergePatch(out[key], value);
  }
  return out;
}
