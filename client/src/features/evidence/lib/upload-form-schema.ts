import { z } from "zod";
import { provenanceSchema } from "@shared/schemas/evidence-api";
import { FILE_KINDS } from "./kinds";

/** A zod issue inside the provenance, said as a sentence that names the key (never the validator's own wording). */
function provenanceIssue(issue: z.core.$ZodIssue): string {
  const where = issue.path.length ? issue.path.join(".") : "the provenance";
  switch (issue.code) {
    case "too_small":
      return issue.origin === "string" ? `${where} is empty` : `${where} must be at least ${String(issue.minimum)}`;
    case "too_big":
      return `${where} must be at most ${String(issue.maximum)}`;
    case "invalid_type":
      return `${where} is missing or is not a ${issue.expected}`;
    case "invalid_value":
      return `${where} must be one of ${issue.values.map(String).join(", ")}`;
    case "unrecognized_keys":
      return `the provenance has keys it does not know: ${issue.keys.join(", ")}`;
    default:
      return `${where}: ${issue.message}`;
  }
}

/** The upload form's values, checked in the browser before anything is sent; the server checks them again. */
export const uploadFormSchema = z.object({
  kind: z.enum(FILE_KINDS, { error: () => "Pick what the file measures." }),
  fingerprint: z
    .string()
    .trim()
    .regex(/^[0-9a-f]{64}$/, "The fingerprint is 64 lowercase hexadecimal characters: the revision's, shown above."),
  provenance: z.string().superRefine((text, ctx) => {
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch {
      ctx.addIssue({ code: "custom", message: "The provenance is not valid JSON; start again from the template." });
      return;
    }
    const parsed = provenanceSchema.safeParse(json);
    if (!parsed.success) {
      const first = provenanceIssue(parsed.error.issues[0]!);
      ctx.addIssue({ code: "custom", message: `In the provenance, ${first}.` });
    }
  }),
  file: z.custom<FileList>(
    (v) => typeof FileList !== "undefined" && v instanceof FileList && v.length === 1,
    "Choose the results file to upload.",
  ),
});
export type UploadFormValues = z.input<typeof uploadFormSchema>;
