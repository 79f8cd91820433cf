import { z } from "zod";

/** Number rules the method parameters share; shared/schemas/analysis.ts re-exports what other contracts need. */

export const MAX_LENGTH = 2 ** 31;
/**
 * Largest head dim an analysis accepts (a request limit, see shared/schemas/analysis.ts): published configs use
 * 64 to 256 (from memory), so 1024 leaves room four times over. One longrope factor per rotary pair.
 */
export const MAX_HEAD_DIM = 1024;
export const MAX_FACTOR_LIST = MAX_HEAD_DIM / 2;

/** A token count: whole, positive, at most 2^31. zod's number() already refuses NaN and ±Infinity. */
export const lengthSchema = z
  .number()
  .int("must be a whole number of tokens")
  .positive()
  .max(MAX_LENGTH, "at most 2^31 tokens");
export const positive = z.number().positive().max(1e12);
export const factorSchema = z.number().min(1, "factor must be at least 1").max(MAX_LENGTH).optional();
export const factorListSchema = z
  .array(z.number().positive("every factor must be positive").max(1e12))
  .min(1)
  .max(MAX_FACTOR_LIST, `at most ${MAX_FACTOR_LIST} factors (one per rotary pair of a head dim up to ${MAX_HEAD_DIM})`);
export const baseSchema = z.number().gt(1, "the base must exceed 1").max(1e15);

/** Cross-field rule "a > b" on two optional parameters with defaults; the issue names the field the caller set. */
export function ordered(hiName: string, loName: string, hiDefault: number, loDefault: number) {
  return (v: Record<string, unknown>, ctx: z.RefinementCtx) => {
    const hi = (v[hiName] as number | undefined) ?? hiDefault;
    const lo = (v[loName] as number | undefined) ?? loDefault;
    if (!(hi > lo)) {
      const path = v[hiName] !== undefined ? hiName : loName;
      ctx.addIssue({ code: "custom", path: [path], message: `${hiName} (${hi}) must exceed ${loName} (${lo})` });
    }
  };
}

/**
 * Eq. 22 of Peng et al. 2023: g(s, m) = 0.1·m·ln s + 1 for s > 1, else 1. Shared so the form's placeholder
 * and the engine compute YaRN's default attention factor with the same code.
 */
export const yarnMscale = (s: number, m = 1) => (s <= 1 ? 1 : 0.1 * m * Math.log(s) + 1);
