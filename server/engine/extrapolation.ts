import type { ExtrapolationBound } from "../../shared/schemas/analysis";

/**
 * Liu et al. 2023, "Scaling Laws of RoPE-based Extrapolation".
 * Critical dimension (Lemma 1): d_extra = 2·ceil((d/2)·log_b(L/2π)), the dimensions whose pairs complete
 * at least one rotation inside the trained window.
 */
export function criticalDimension(d: number, base: number, trained: number): number {
  const x = (d / 2) * (Math.log(trained / (2 * Math.PI)) / Math.log(base));
  return Math.min(d, Math.max(0, 2 * Math.ceil(x)));
}

/** Critical base (Theorem 3): β_0 = b^(log_{L/2π}(T_tune/2π)). */
export function criticalBase(base: number, trained: number, tune: number): number {
  return Math.pow(base, Math.log(tune / (2 * Math.PI)) / Math.log(trained / (2 * Math.PI)));
}

/**
 * Extrapolation bound (Theorem 3) for a model of original base b and trained length L tuned with base β at T_tune:
 * above the critical base T_extra = 2π·β^(d_extra/d); otherwise the bound is T_tune.
 */
export function extrapolationBound(p: {
  d: number;
  originalBase: number;
  trained: number;
  base: number;
  tune: number;
}): ExtrapolationBound {
  const dExtra = criticalDimension(p.d, p.originalBase, p.trained);
  const beta0 = criticalBase(p.originalBase, p.trained, p.tune);
  const tExtra = 2 * Math.PI * Math.pow(p.base, dExtra / p.d);
  const above = p.base > beta0;
  return {
    base: p.base,
    tuneContext: p.tune,
    criticalBase: beta0,
    baseAboveCritical: above,
    tExtra,
    bound: above ? tExtra : p.tune,
  };
}
