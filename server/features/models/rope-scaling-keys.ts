import { COMMON_SCALING_KEYS, methodForRopeType } from "../../../shared/methods";

/**
 * The rope_scaling keys loaders read for a rope_type (current or older spelling), from the method catalog where
 * their source is cited; undefined for a rope_type no method answers to. The look-up is a Map, so names such as
 * "constructor" or "__proto__" are simply unknown.
 */
export function ropeScalingKnownKeys(type: string): string[] | undefined {
  const entry = methodForRopeType(type);
  return entry && [...COMMON_SCALING_KEYS, ...entry.configKeys];
}

function editDistance(a: string, b: string) {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let prev = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const tmp = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, prev + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev = tmp;
    }
  }
  return row[b.length];
}

/** The nearest known key within a small edit distance, for "did you mean". */
export function suggestKey(key: string, known: string[]): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const k of known) {
    const d = editDistance(key.toLowerCase(), k);
    if (d < bestD) [best, bestD] = [k, d];
  }
  return bestD <= Math.max(2, Math.floor(key.length / 4)) ? best : undefined;
}
