import { createHash } from "node:crypto";
import { rotaryDimension, type MethodParams, type ModelShape } from "../../shared/schemas/analysis";
import type { GroupRotarySpec } from "../../shared/layer-groups";
import { runMethod } from "./methods";
import { rotateGroups } from "./group-rotary";

/**
 * The rotary fingerprint (docs/fingerprint.md): SHA-256 over a fixed byte layout of what the attention layers actually
 * rotate with, so two exports, a probe run and a revision can be compared by one string.
 *
 * Layout, version 1: the ASCII tag "ropewalk-rotary/1" and one zero byte, then one record per layer group in the order
 * of the group's first layer. A record is rotaryDim (uint32, little-endian), the attention factor (float64, LE) and
 * θ′_0 … θ′_{d/2−1} (float64, LE each). A single-group model hashes the tag and its one record, so adding groups later
 * (per-layer-type rotary settings) leaves every single-group fingerprint unchanged.
 */
export const FINGERPRINT_TAG = "ropewalk-rotary/1";

export interface RotaryGroup {
  rotaryDim: number;
  attentionFactor: number;
  invFreq: ArrayLike<number>;
}

/** The bytes that are hashed; exported so the documentation's worked example can be checked byte for byte. */
export function fingerprintBytes(groups: readonly RotaryGroup[]): Uint8Array {
  if (groups.length === 0) throw new RangeError("a fingerprint needs at least one layer group");
  const tag = new TextEncoder().encode(FINGERPRINT_TAG);
  const size = groups.reduce((n, g) => n + 4 + 8 + 8 * g.invFreq.length, tag.length + 1);
  const bytes = new Uint8Array(size);
  const view = new DataView(bytes.buffer);
  bytes.set(tag, 0);
  let at = tag.length + 1; // the zero byte after the tag is already there
  for (const g of groups) {
    if (!Number.isInteger(g.rotaryDim) || g.rotaryDim <= 0 || g.invFreq.length !== g.rotaryDim / 2) {
      throw new RangeError(`layer group: rotaryDim ${g.rotaryDim} needs rotaryDim/2 frequencies`);
    }
    view.setUint32(at, g.rotaryDim, true);
    view.setFloat64(at + 4, g.attentionFactor, true);
    at += 12;
    for (let i = 0; i < g.invFreq.length; i++, at += 8) view.setFloat64(at, g.invFreq[i], true);
  }
  return bytes;
}

/** Lower-case hex SHA-256 of fingerprintBytes(groups). */
export function rotaryFingerprint(groups: readonly RotaryGroup[]): string {
  return createHash("sha256").update(fingerprintBytes(groups)).digest("hex");
}

/**
 * The fingerprint of a plan: its block's θ′ and attention factor on the model's rotary dimension, or for a layered
 * model one record per rotating layer group (`groups`, shared/layer-groups.ts groupRotarySpecs, in first-layer order),
 * each with its own base, rotary dimension and method. Throws when the model has no valid rotary dimension.
 */
export function planFingerprint(
  model: ModelShape,
  targetContext: number,
  method: MethodParams,
  groups?: readonly GroupRotarySpec[],
): string {
  if (groups?.length) return rotaryFingerprint(rotateGroups(groups, model.trainedContext, targetContext));
  const d = rotaryDimension(model);
  if (d === null) throw new RangeError("rotary dimension must be a positive even integer");
  const ctx = { d, base: model.ropeTheta, trainedContext: model.trainedContext, targetContext };
  const out = runMethod(ctx, method);
  return rotaryFingerprint([{ rotaryDim: d, attentionFactor: out.attentionFactor, invFreq: out.invFreq }]);
}
