import { z } from "zod";
import { dbIdSchema, SHA256_HEX } from "./common";

/*
 * Conformance checks (issue 10): the JSON tools/probe/ropewalk_probe.py writes in the user's environment, uploaded on a
 * plan revision, and the check Ropewalk records from it. The probe's format is `ropewalk-probe/1` (tools/probe/README.md).
 */

const hex64 = z.string().regex(SHA256_HEX, "64 lower-case hex digits (a SHA-256)");
const text = (max: number) => z.string().trim().min(1).max(max);

const rotaryDimSchema = z
  .number()
  .int()
  .min(2)
  .max(8192)
  .refine((d) => d % 2 === 0, "an even number");
const invFreqSchema = z.array(z.number().finite().positive()).min(1).max(4096);
const pairsMatch = { path: ["invFreq"], message: "needs rotaryDim / 2 frequencies" };

/**
 * One layer type's reading, when the config nests rope_parameters by layer type (transformers 5.x): the layers that
 * rotate with it (indices into layer_types) and what the library built for them.
 */
export const probeGroupSchema = z
  .object({
    layerType: text(80),
    layers: z.array(z.number().int().min(0).max(9999)).min(1).max(10000),
    ropeType: text(40),
    readFrom: z.string().max(160).optional(),
    rotaryDim: rotaryDimSchema,
    attentionFactor: z.number().finite().positive(),
    invFreq: invFreqSchema,
  })
  .refine((g) => g.invFreq.length * 2 === g.rotaryDim, pairsMatch);
export type ProbeGroup = z.infer<typeof probeGroupSchema>;

/**
 * One probe result, as the probe writes it; unknown keys are dropped. A layered config's result adds `layerGroups`
 * (every layer type, in first-layer order; the top-level reading is the scaled group's), and its readFingerprint
 * hashes one record per group (docs/fingerprint.md).
 */
export const probeResultSchema = z
  .object({
    probe: z.literal("ropewalk-probe/1", {
      error: 'expected "ropewalk-probe/1" (a file written by the Ropewalk probe)',
    }),
    library: text(80),
    libraryVersion: text(80),
    python: z.string().max(40).optional(),
    ropeType: text(40),
    readFrom: z.string().max(160).optional(),
    layerType: z.string().max(80).nullable().optional(),
    runningLength: z
      .number()
      .int()
      .positive()
      .max(2 ** 31 - 1),
    rotaryDim: rotaryDimSchema,
    attentionFactor: z.number().finite().positive(),
    invFreq: invFreqSchema,
    planFingerprint: hex64.nullable(),
    readFingerprint: hex64,
    layerGroups: z
      .array(probeGroupSchema)
      .min(1)
      .max(16)
      .refine((gs) => new Set(gs.map((g) => g.layerType)).size === gs.length, "one entry per layer type")
      .optional(),
  })
  .refine((r) => r.invFreq.length * 2 === r.rotaryDim, pairsMatch);
export type ProbeResult = z.infer<typeof probeResultSchema>;

/**
 * One layer group's result within a check on a layered revision (or a probe that read several layer types): the
 * group's kind and layers (indices into layer_types), and its own comparison.
 */
export const probeGroupCheckSchema = z.object({
  kind: z.string(),
  layers: z.array(z.number().int()),
  passed: z.boolean(),
  maxRelativeError: z.number().nullable(),
  worstPair: z.number().int().nullable(),
  cause: z.string(),
});
export type ProbeGroupCheck = z.infer<typeof probeGroupCheckSchema>;

/** A recorded check: pass when every θ′ and the attention factor agree with the revision's at float32 tolerance. */
export const conformanceCheckSchema = z.object({
  id: dbIdSchema,
  revision: z.number().int(),
  /** the revision's content hash when the check was recorded (a draft may change afterwards) */
  contentHash: z.string(),
  passed: z.boolean(),
  /** largest |probe − revision| / |revision| over θ′ and the attention factor; null when the shapes differ */
  maxRelativeError: z.number().nullable(),
  /** the pair index with that error; null when it is the attention factor, or nothing could be paired */
  worstPair: z.number().int().nullable(),
  cause: z.string(),
  library: z.string(),
  libraryVersion: z.string(),
  ropeType: z.string(),
  runningLength: z.number().int(),
  planFingerprint: z.string().nullable(),
  readFingerprint: z.string(),
  /** whether the fingerprint the probe was asked to check is this revision's; null when it was given none */
  fingerprintMatches: z.boolean().nullable(),
  /**
   * Per layer group, in first-layer order: every group's own result (the fields above are the worst group's). Null
   * when every layer rotates alike and the probe read one setting, and on checks recorded before groups were kept.
   */
  groups: z.array(probeGroupCheckSchema).nullable(),
  by: z.object({ id: z.number(), name: z.string() }),
  via: z.enum(["session", "token"]),
  at: z.string(),
});
export type ConformanceCheck = z.infer<typeof conformanceCheckSchema>;
export const conformanceCheckListSchema = z.object({ checks: z.array(conformanceCheckSchema) });
export type ConformanceCheckList = z.infer<typeof conformanceCheckListSchema>;
