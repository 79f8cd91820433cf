import { z } from "zod";
import { lengthSchema, MAX_LENGTH } from "./analysis";

/**
 * Contract of POST /api/bounds/base (and /base/stream): the base lower bound of Men et al. 2024.
 * Either { rotaryDim, base, maxLength? } → the supported length of that base,
 * or { rotaryDim, targetContext, grid? } → the smallest grid base that supports the target.
 */

export const DEFAULT_SCAN_LIMIT = 2 ** 24;
export const DEFAULT_GRID = { from: 1e3, to: 1e10, perDecade: 100 } as const;
const MAX_CANDIDATES = 10_000;

const rotaryDimSchema = z
  .number()
  .int()
  .positive()
  .max(8192)
  .refine((d) => d % 2 === 0, "the rotary dimension must be even");
const baseValue = z.number().gt(1, "the base must exceed 1").max(1e15);

export const baseGridSchema = z
  .strictObject({
    from: baseValue,
    to: baseValue,
    perDecade: z.number().int().positive().max(1000),
  })
  .superRefine((g, ctx) => {
    if (!(g.to > g.from)) ctx.addIssue({ code: "custom", path: ["to"], message: "to must exceed from" });
    else if (g.perDecade * Math.log10(g.to / g.from) > MAX_CANDIDATES) {
      ctx.addIssue({ code: "custom", path: ["perDecade"], message: `at most ${MAX_CANDIDATES} candidates` });
    }
  });
export type BaseGridInput = z.infer<typeof baseGridSchema>;

export const supportedLengthQuerySchema = z.object({
  kind: z.literal("supportedLength"),
  rotaryDim: z.number().int(),
  base: z.number(),
  maxLength: z.number().int(),
});
export const smallestBaseQuerySchema = z.object({
  kind: z.literal("smallestBase"),
  rotaryDim: z.number().int(),
  targetContext: z.number().int(),
  grid: z.object({ from: z.number(), to: z.number(), perDecade: z.number().int() }),
});
/** The validated request with defaults filled in, tagged by kind (what the worker receives). */
export const baseBoundQuerySchema = z.discriminatedUnion("kind", [supportedLengthQuerySchema, smallestBaseQuerySchema]);
export type BaseBoundQuery = z.infer<typeof baseBoundQuerySchema>;

/** HTTP body: one flat object so every bad field is named; exactly one of base / targetContext. */
export const baseBoundRequestSchema = z
  .strictObject({
    rotaryDim: rotaryDimSchema,
    base: baseValue.optional(),
    maxLength: lengthSchema.optional(),
    targetContext: lengthSchema.optional(),
    grid: baseGridSchema.optional(),
  })
  .superRefine((r, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: "custom", path: [path], message });
    if (r.base === undefined && r.targetContext === undefined)
      issue("base", "give base (supported length) or targetContext (smallest base)");
    if (r.base !== undefined && r.targetContext !== undefined)
      issue("targetContext", "give either base or targetContext, not both");
    if (r.base !== undefined && r.grid) issue("grid", "grid goes with targetContext");
    if (r.targetContext !== undefined && r.maxLength !== undefined) issue("maxLength", "maxLength goes with base");
  })
  .transform((r): BaseBoundQuery =>
    r.base !== undefined
      ? { kind: "supportedLength", rotaryDim: r.rotaryDim, base: r.base, maxLength: r.maxLength ?? DEFAULT_SCAN_LIMIT }
      : {
          kind: "smallestBase",
          rotaryDim: r.rotaryDim,
          targetContext: r.targetContext!,
          grid: r.grid ?? { ...DEFAULT_GRID },
        },
  );
export type BaseBoundRequest = z.input<typeof baseBoundRequestSchema>;

export const supportedLengthResponseSchema = z.object({
  /** first m with Σ cos(m·θ_i) < 0, or null when none below maxLength */
  supportedLength: z.number().int().nullable(),
  maxLength: z.number().int().max(MAX_LENGTH),
});
export const smallestBaseResponseSchema = z.object({
  smallestBase: z.number().nullable(),
  candidatesExamined: z.number().int(),
  candidatesTotal: z.number().int(),
  grid: z.object({ from: z.number(), to: z.number(), perDecade: z.number().int() }),
});
export const baseBoundResponseSchema = z.union([supportedLengthResponseSchema, smallestBaseResponseSchema]);
export type SupportedLengthResponse = z.infer<typeof supportedLengthResponseSchema>;
export type SmallestBaseResponse = z.infer<typeof smallestBaseResponseSchema>;
export type BaseBoundResponse = z.infer<typeof baseBoundResponseSchema>;

/** Server-sent events of /api/bounds/base/stream: `progress` (repeated), then `result` or `error`. */
export const boundProgressEventSchema = z.union([
  z.object({ candidatesExamined: z.number().int(), total: z.number().int() }),
  z.object({ position: z.number().int(), maxLength: z.number().int() }),
]);
export type BoundProgress = z.infer<typeof boundProgressEventSchema>;
