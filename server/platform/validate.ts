import { z } from "zod";
import { Invalid } from "./errors";
import { assertNotHostile } from "./hostile";
import { plainSentence, summarizeFields } from "../../shared/validation-messages";

/** Turns zod issues into { "a.b.0": "A sentence naming the field." } so every bad field is named in plain words. */
export function issuesToFields(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "(body)";
    if (!(key in fields)) fields[key] = plainSentence(issue.path, issue.message);
  }
  return fields;
}

export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, what = "request"): z.infer<S> {
  // NUL characters and runaway nesting are refused before zod (and then PostgreSQL) sees them.
  assertNotHostile(value, what);
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = issuesToFields(result.error);
    throw new Invalid(summarizeFields(fields), fields);
  }
  return result.data;
}

/** A 400 for issues found after parsing (rules that need a stored row): each field named in a plain sentence. */
export function invalidFields(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Invalid {
  const fields: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.length ? issue.path.map(String).join(".") : "(body)";
    fields[key] ??= plainSentence(issue.path, issue.message);
  }
  return new Invalid(summarizeFields(fields), fields);
}
