/*
 * Which position axis each rotary pair rotates by, for multimodal sections (`mrope_section`). Followed loaders:
 * - contiguous: huggingface/transformers src/transformers/models/qwen2_vl/modeling_qwen2_vl.py,
 *   apply_multimodal_rotary_pos_emb (v4.4x line, read through stored copies; the same split config-import.ts cites):
 *   cos/sin are split into blocks of `mrope_section` pairs and block i takes axis i % 3, so the first section's pairs
 *   follow the temporal position, the next the height, the next the width.
 * - interleaved (`mrope_interleaved: true`): huggingface/transformers src/transformers/models/qwen3_vl/
 *   modeling_qwen3_vl.py, Qwen3VLTextRotaryEmbedding.apply_interleaved_mrope (v4.57 line, read through stored
 *   copies): every pair starts temporal; pairs j ≡ 1 (mod 3) with j < 3·section[1] take the height, pairs j ≡ 2
 *   (mod 3) with j < 3·section[2] the width (T H W T H W … T T).
 */
export const MROPE_AXES = ["temporal", "height", "width"] as const;

/**
 * The config keys that carry the sections, inside the scaling block of any rope_type: huggingface/transformers,
 * src/transformers/models/qwen2_vl/configuration_qwen2_vl.py validates the block with `ignore_keys={"mrope_section"}`
 * (v4.4x line, read through stored copies); `mrope_interleaved` is the interleaved layout's flag (from memory of the
 * qwen3_vl configs). The import reads them there; the config exports keep them there.
 */
export const MROPE_KEYS = ["mrope_section", "mrope_interleaved"] as const;

/** The multimodal section keys a config block carries, or null when it carries none (or is not an object). */
export function sectionKeysOf(block: unknown): Record<string, unknown> | null {
  if (typeof block !== "object" || block === null || Array.isArray(block)) return null;
  const out: Record<string, unknown> = {};
  for (const k of MROPE_KEYS) if (k in block) out[k] = (block as Record<string, unknown>)[k];
  return Object.keys(out).length ? out : null;
}
/**
 * The sections a config block holds, as numbers, with its layout flag: null when the block is not an object or has no
 * numeric `mrope_section`.
 */
export function blockSections(block: unknown): { section: number[]; interleaved: boolean } | null {
  if (typeof block !== "object" || block === null || Array.isArray(block)) return null;
  const b = block as Record<string, unknown>;
  const s = b.mrope_section;
  if (!Array.isArray(s) || !s.every((n) => typeof n === "number")) return null;
  return { section: s as number[], interleaved: b.mrope_interleaved === true };
}

export type MropeAxis = (typeof MROPE_AXES)[number];

/** The axis of each of `pairs` rotary pairs; null for a pair the sections do not reach (their sum falls short). */
export function mropeAxisOfPairs(
  section: readonly number[],
  interleaved: boolean,
  pairs: number,
): (MropeAxis | null)[] {
  if (interleaved) {
    return Array.from({ length: pairs }, (_, j): MropeAxis => {
      if (j % 3 === 1 && j < 3 * (section[1] ?? 0)) return "height";
      if (j % 3 === 2 && j < 3 * (section[2] ?? 0)) return "width";
      return "temporal";
    });
  }
  const out: (MropeAxis | null)[] = [];
  section.forEach((n, i) => {
    for (let k = 0; k < n; k++) out.push(MROPE_AXES[i % 3]);
  });
  return Array.from({ length: pairs }, (_, j) => out[j] ?? null);
}

/** Consecutive pairs on one axis, as bands over the pair axis: `from`…`to` inclusive. */
export interface MropeBand {
  axis: MropeAxis;
  from: number;
  to: number;
}

export function mropeBands(section: readonly number[], interleaved: boolean, pairs: number): MropeBand[] {
  const axes = mropeAxisOfPairs(section, interleaved, pairs);
  const bands: MropeBand[] = [];
  axes.forEach((axis, j) => {
    if (axis === null) return;
    const last = bands[bands.length - 1];
    if (last && last.axis === axis && last.to === j - 1) last.to = j;
    else bands.push({ axis, from: j, to: j });
  });
  return bands;
}

/** Per axis: the pairs it rotates, in plain words for the plan page and the report. */
export function mropeAxisSummary(section: readonly number[], interleaved: boolean, pairs: number) {
  const axes = mropeAxisOfPairs(section, interleaved, pairs);
  return MROPE_AXES.map((axis) => ({ axis, pairs: axes.flatMap((a, j) => (a === axis ? [j] : [])) })).filter(
    (a) => a.pairs.length > 0,
  );
}
