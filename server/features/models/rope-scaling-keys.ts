/** Keys each rope_type of the open model-configuration convention reads (from memory of the common loaders). */
const COMMON = ["rope_type", "type", "factor", "original_max_position_embeddings", "rope_theta", "partial_rotary_factor"];
const BY_TYPE: Record<string, string[]> = {
  default: COMMON,
  linear: COMMON,
  dynamic: COMMON,
  yarn: [...COMMON, "attention_factor", "beta_fast", "beta_slow", "mscale", "mscale_all_dim", "truncate"],
  longrope: [...COMMON, "attention_factor", "long_factor", "short_factor", "long_mscale", "short_mscale"],
  su: [...COMMON, "attention_factor", "long_factor", "short_factor", "long_mscale", "short_mscale"],
  llama3: [...COMMON, "low_freq_factor", "high_freq_factor"],
};

export const ropeScalingKnownKeys = (type: string): string[] | undefined => BY_TYPE[type];

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
