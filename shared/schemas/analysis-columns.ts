import { z } from "zod";
import { analysisResponseSchema, BAND_IDS, methodResultSchema } from "./analysis";

/**
 * The column form of POST /api/analyses, asked for with `"form": "columns"` in the body (the workbench and plan
 * pages do; the default answer stays the row form for other API callers). Same numbers, laid out so that nothing
 * is repeated:
 * - the pair table as one array per field instead of one object per pair (no key names per value, no `index`);
 * - the columns that only depend on the original frequencies and the window (invFreq, wavelength, rotations, band,
 *   exceedsTrainedWindow: classifyPairs judges them on the unscaled θ) once for the whole answer, not once per method;
 * - flags as 0/1.
 * `expandAnalysis` (shared/analysis-columns.ts) turns it back into exactly the row form.
 */
const num = z.number();
const flags = z.array(z.union([z.literal(0), z.literal(1)]));

export const sharedPairColumnsSchema = z.object({
  invFreq: z.array(num),
  wavelength: z.array(num),
  rotationsInTrainedWindow: z.array(num),
  band: z.array(z.enum(BAND_IDS)),
  exceedsTrainedWindow: flags,
});
export const methodPairColumnsSchema = z.object({
  scaledInvFreq: z.array(num),
  scaledWavelength: z.array(num),
  unseenAngles: flags,
  compressedResolution: flags,
});

export const columnMethodResultSchema = methodResultSchema.omit({ pairs: true }).extend({
  pairColumns: methodPairColumnsSchema,
});

export const analysisColumnsResponseSchema = analysisResponseSchema.omit({ methods: true }).extend({
  form: z.literal("columns"),
  pairColumns: sharedPairColumnsSchema,
  methods: z.array(columnMethodResultSchema),
});
export type AnalysisColumnsResponse = z.infer<typeof analysisColumnsResponseSchema>;

/** Either form, as POST /api/analyses documents its 200. */
export const anyAnalysisResponseSchema = z.union([analysisResponseSchema, analysisColumnsResponseSchema]);
