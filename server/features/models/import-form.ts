import { z } from "zod";
import { Invalid } from "../../platform/errors";
import { assertNotHostile } from "../../platform/hostile";
import { parseOr400 } from "../../platform/validate";

/** The text fields beside the uploaded file (multipart form or query string). */
export const importFlagsSchema = z.object({
  save: z.enum(["true", "false"]).optional(),
  overrides: z
    .string()
    .max(64_000)
    .optional()
    .describe("JSON object of profile fields applied on top of the parsed config"),
});

/** The multipart request as documented: the file plus the flags. */
export const importFormSchema = importFlagsSchema.extend({ file: z.string().describe("config.json (binary)") });

/** Reads `save` and the JSON `overrides` of an import request; a bad value is a 400 naming the field. */
export function readImportForm(fields: unknown): { save: boolean; overrides: Record<string, unknown> } {
  const flags = parseOr400(importFlagsSchema, fields, "form");
  let overrides: unknown = {};
  if (flags.overrides) {
    try {
      overrides = JSON.parse(flags.overrides);
    } catch {
      throw new Invalid("overrides must be JSON", { overrides: "not valid JSON" });
    }
    assertNotHostile(overrides, "form", ["overrides"]);
    if (typeof overrides !== "object" || overrides === null || Array.isArray(overrides)) {
      throw new Invalid("overrides must be a JSON object of profile fields", { overrides: "not a JSON object" });
    }
  }
  return { save: flags.save === "true", overrides: overrides as Record<string, unknown> };
}
