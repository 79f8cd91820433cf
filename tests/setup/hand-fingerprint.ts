import { createHash } from "node:crypto";

/*
 * Check values for fingerprints, computed independently of server/engine: the byte layout of docs/fingerprint.md
 * written out with Node's Buffer, and plain RoPE θᵢ = b^(−2i/d) (RoFormer, Su et al. 2021, eq. 15).
 */
export const plainRope = (d: number, b: number) => Array.from({ length: d / 2 }, (_, i) => b ** ((-2 * i) / d));

/** Tag, zero byte, then per group uint32 d, float64 attention factor, float64 θ′ (all little-endian), SHA-256 hex. */
export function handFingerprint(records: { d: number; a: number; theta: number[] }[]) {
  const parts = [Buffer.from("ropewalk-rotary/1\0", "ascii")];
  for (const r of records) {
    const b = Buffer.alloc(12 + 8 * r.theta.length);
    b.writeUInt32LE(r.d, 0);
    b.writeDoubleLE(r.a, 4);
    r.theta.forEach((t, i) => b.writeDoubleLE(t, 12 + 8 * i));
    parts.push(b);
  }
  return createHash("sha256").update(Buffer.concat(parts)).digest("hex");
}
